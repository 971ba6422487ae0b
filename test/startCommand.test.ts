import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { createTestDatabase, type TestDatabase } from './helpers/db';
import { uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * `holdfast start` against an external PostgreSQL and broker (the machine's
 * when TEST_* are set): it must start no embedded service, write real rows
 * through MQTT, compute daily rows, and stop cleanly on SIGINT.
 */
function holdfast(args: string[], env: Record<string, string>): ChildProcessWithoutNullStreams {
  return spawn(process.execPath, ['bin/holdfast.mjs', ...args], { env: { ...process.env, ...env } });
}

describe('holdfast start (without the web app)', () => {
  const suffix = uniqueSuffix();
  let db: TestDatabase;
  let child: ChildProcessWithoutNullStreams;
  let output = '';

  beforeAll(async () => {
    db = await createTestDatabase();
    child = holdfast(['start', '--no-web'], {
      DATABASE_URL: db.url,
      MQTT_URL: inject('mqttUrl'),
      MQTT_TOPIC_ROOT: `start-${suffix}/v1`,
      MQTT_CLIENT_ID: `holdfast-start-${suffix}`,
      HOLDFAST_DATA_DIR: `/tmp/holdfast-start-${suffix}`,
      HOLDFAST_DEMO_INTERVAL_S: '1',
      HOLDFAST_DEMO_HISTORY_DAYS: '1',
    });
    child.stdout.on('data', (d) => (output += d));
    child.stderr.on('data', (d) => (output += d));
    await waitFor(() => output.includes('Holdfast is running'), 60_000, 'the start-up line');
  });
  afterAll(async () => {
    if (child && child.exitCode === null) child.kill('SIGKILL');
    await db?.drop();
    rmSync(`/tmp/holdfast-start-${suffix}`, { recursive: true, force: true });
  });

  it('uses the given database and broker and starts no embedded service', () => {
    expect(output).not.toMatch(/embedded PostgreSQL|embedded MQTT broker/);
    expect(output).toContain('imported the demo fleet (12 vessels, 2 campaigns)');
  });

  it('stores demo telemetry that arrives over MQTT, and keeps storing it', async () => {
    const count = async () => (await db.pool.query('SELECT count(*)::int AS n FROM ts_station')).rows[0].n as number;
    await waitFor(async () => (await count()) > 12 * 1440, 90_000, 'the demo history');
    const first = await count();
    await waitFor(async () => (await count()) >= first + 24, 20_000, 'live records');
  }, 120_000);

  it('backfills the demo history in the background from the simulator, with its ground truth, nothing quarantined', async () => {
    expect(output).toContain('demo history: backfilling 1 day(s) in the background');
    await waitFor(() => output.includes('demo history published'), 90_000, 'the end of the backfill');
    const truthFile = `/tmp/holdfast-start-${suffix}/demo-ground-truth.json`;
    expect(existsSync(truthFile)).toBe(true);
    const truth = JSON.parse(readFileSync(truthFile, 'utf8')) as { seed: number; history: { days: number }; entries: { scenario: string }[] };
    expect(truth).toMatchObject({ seed: 1, history: { days: 1 } });
    expect(new Set(truth.entries.map((e) => e.scenario)).size).toBe(6);
    // The history holds every interval of yesterday for every vessel, in more than one DP mode.
    const yesterday = new Date(Date.now() - 86_400_000).toISOString().slice(0, 10);
    const { rows } = await db.pool.query<{ n: number; modes: string[] }>(
      `SELECT count(*)::int AS n, array_agg(DISTINCT mode) AS modes FROM ts_station WHERE t >= $1::date AND t < $1::date + 1`,
      [yesterday],
    );
    expect(rows[0]!.n).toBe(12 * 1440);
    expect(rows[0]!.modes).toContain('auto_position');
    expect(rows[0]!.modes.length).toBeGreaterThan(1);
    expect((await db.pool.query('SELECT count(*)::int AS n FROM quarantine')).rows[0].n).toBe(0);
  }, 100_000);

  it('serves ingest metrics and health on the status server it logged', async () => {
    const url = /ingest metrics: (http:\/\/localhost:\d+)\/metrics/.exec(output)?.[1];
    expect(url, 'the status server URL in the log').toBeDefined();
    const health = await fetch(`${url}/healthz`);
    expect(health.status).toBe(200);
    expect(await health.json()).toMatchObject({ status: 'ok', broker: 'connected', database: 'ok' });
    const metrics = await (await fetch(`${url}/metrics`)).text();
    const stored = /^holdfast_ingest_rows_stored_total\{stream="station"\} (\d+)$/m.exec(metrics)?.[1];
    expect(Number(stored)).toBeGreaterThan(0);
  });

  it('computes daily rows for the days that received records', async () => {
    await waitFor(
      async () => (await db.pool.query('SELECT count(*)::int AS n FROM daily_vessel')).rows[0].n >= 12,
      90_000,
      'daily rows',
    );
  }, 100_000);

  it('stops everything on SIGINT', async () => {
    const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
    child.kill('SIGINT');
    // 130 = 128 + SIGINT: the conventional status of a program stopped by Ctrl-C.
    expect([0, 130]).toContain(await exited);
    expect(output).toContain('stopped');
  });
});

describe('holdfast with a bad setting', () => {
  it('stops at start with one line naming the setting', async () => {
    const child = holdfast(['start'], { FLEET_TIME_ZONE: 'Atlantis/Lost' });
    let stderr = '';
    child.stderr.on('data', (d) => (stderr += d));
    const code = await new Promise<number | null>((resolve) => child.once('exit', resolve));
    expect(code).toBe(1);
    expect(stderr.trim().split('\n')).toEqual([
      'Setting FLEET_TIME_ZONE: must be an IANA time zone name such as UTC or Europe/Oslo (got "Atlantis/Lost")',
    ]);
  });
});
