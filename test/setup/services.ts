import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import { startEmbeddedBroker } from '../../lib/broker/embedded';
import { startEmbeddedDatabase } from '../../lib/db/embedded';

/**
 * One PostgreSQL server and one MQTT broker for the whole run: the machine's
 * (TEST_DATABASE_URL, TEST_MQTT_URL) when set, embedded ones otherwise. Each
 * test file creates its own database on that server (test/helpers/db.ts).
 */
declare module 'vitest' {
  export interface ProvidedContext {
    databaseUrl: string;
    mqttUrl: string;
    mqttIsMosquitto: boolean;
  }
}

export default async function setup(project: TestProject) {
  const stops: (() => Promise<void>)[] = [];
  let databaseUrl = process.env.TEST_DATABASE_URL?.trim();
  if (!databaseUrl) {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-test-pg-'));
    // As root the server runs as the postgres user, which must reach the folder.
    chmodSync(dir, 0o755);
    const db = await startEmbeddedDatabase({ dir: path.join(dir, 'pg'), port: 0, persistent: false });
    databaseUrl = db.url;
    stops.push(async () => {
      await db.stop();
      rmSync(dir, { recursive: true, force: true });
    });
  }
  let mqttUrl = process.env.TEST_MQTT_URL?.trim();
  const mqttIsMosquitto = Boolean(mqttUrl);
  if (!mqttUrl) {
    const broker = await startEmbeddedBroker(0);
    mqttUrl = broker.url;
    stops.push(() => broker.stop());
  }
  project.provide('databaseUrl', databaseUrl);
  project.provide('mqttUrl', mqttUrl);
  project.provide('mqttIsMosquitto', mqttIsMosquitto);

  return async () => {
    for (const stop of stops.reverse()) await stop();
  };
}
