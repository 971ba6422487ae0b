import { spawn } from 'node:child_process';
import { existsSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
// @ts-expect-error -- plain JavaScript, run before any TypeScript loader (no type declarations)
import { bundledCli } from '../ingest/bundle.mjs';
import { createTestDatabase, type TestDatabase } from './helpers/db';
import { uniqueSuffix } from './helpers/fleet';

/**
 * `holdfast ingest` runs from an esbuild bundle of the CLI instead of under
 * tsx (ingest/bundle.mjs). The bundle must be found again for the same
 * sources, and the worker started from it must find what it looks up next
 * to its source files (the migrations) and not fall back to tsx.
 */
describe('the ingest worker bundle', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createTestDatabase();
  });
  afterAll(async () => db?.drop());

  it('is built once per content: the same sources give the same folder', async () => {
    const first: string = await bundledCli();
    const second: string = await bundledCli();
    expect(second).toBe(first);
    expect(existsSync(fileURLToPath(first))).toBe(true);
  });

  it('starts the worker, which migrates an empty store and subscribes, without tsx', async () => {
    const suffix = uniqueSuffix();
    const child = spawn(process.execPath, ['bin/holdfast.mjs', 'ingest'], {
      env: {
        ...process.env,
        DATABASE_URL: db.url,
        HOLDFAST_STORE: 'partitions',
        MQTT_URL: inject('mqttUrl'),
        MQTT_TOPIC_ROOT: `bundle-${suffix}/v1`,
        MQTT_CLIENT_ID: `holdfast-bundle-${suffix}`,
        HOLDFAST_METRICS_PORT: '0',
        LOG_FORMAT: 'json',
      },
    });
    let output = '';
    const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
    await new Promise<void>((resolve, reject) => {
      const onData = (d: Buffer) => {
        output += d.toString();
        if (output.includes('SIGTERM stops it cleanly')) resolve();
      };
      child.stdout.on('data', onData);
      child.stderr.on('data', onData);
      void exited.then((code) => reject(new Error(`worker exited (${code}): ${output}`)));
    });
    // Stopped as an operator would, once it says a signal stops it cleanly.
    expect(output).toContain('subscribed to');
    child.kill('SIGTERM');
    expect(await exited).toBe(0);
    // An empty database: the worker applied the migrations, found beside lib/db as under tsx.
    expect(output).toMatch(/"msg":"migrated 0001_register \(partitions\)"/);
    expect(output).not.toContain('running under tsx');
  });
});
