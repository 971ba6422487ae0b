import { spawn, type ChildProcess } from 'node:child_process';
import mqtt, { type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { fleetDay } from '../lib/time/fleetDay';
import { Random } from '../seed/random';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * The worker process is SIGKILLed at random moments while a publisher sends
 * single records and backlog batches, and restarted each time. The store
 * must end with exactly what was published: nothing lost (unacknowledged
 * messages are delivered again) and nothing doubled (the keys make a
 * redelivery harmless).
 */
const KILLS = 5;
const INTERVALS = 1_500; // per vessel, per stream

describe('ingest worker killed mid-stream', () => {
  const suffix = uniqueSuffix();
  const root = `kill-${suffix}/v1`;
  const keys = ['a', 'b', 'c'].map((k) => `kill-${k}-${suffix}`);
  let db: TestDatabase;
  let worker: ChildProcess | undefined;
  let publisher: MqttClient;
  let log = '';

  function startWorker(): Promise<void> {
    const child = spawn(process.execPath, ['bin/holdfast.mjs', 'ingest'], {
      env: {
        ...process.env,
        DATABASE_URL: db.url,
        MQTT_URL: inject('mqttUrl'),
        MQTT_TOPIC_ROOT: root,
        MQTT_CLIENT_ID: `holdfast-kill-${suffix}`,
        LOG_LEVEL: 'info',
        // No status server: the default port may be held by another test's process.
        HOLDFAST_METRICS_PORT: '0',
      },
    });
    worker = child;
    return new Promise((resolve, reject) => {
      const onData = (d: Buffer) => {
        log += d.toString();
        if (d.toString().includes('subscribed to')) resolve();
      };
      child.stdout!.on('data', onData);
      child.stderr!.on('data', onData);
      child.once('exit', (code, signal) => signal !== 'SIGKILL' && reject(new Error(`worker exited (${code}): ${log.slice(-2000)}`)));
    });
  }

  beforeAll(async () => {
    db = await createMigratedDatabase();
    for (const key of keys) await registerFleet(db.url, smallFleet(key));
    publisher = await mqtt.connectAsync(inject('mqttUrl'), { clientId: `kill-pub-${suffix}` });
  });
  afterAll(async () => {
    worker?.kill('SIGKILL');
    await publisher?.endAsync();
    await db?.drop();
  });

  it('stores exactly the published records after repeated SIGKILLs', async () => {
    await startWorker();
    const rng = new Random(20261201);
    const start = Date.UTC(2026, 10, 25, 20, 0);
    const published = { station: 0, thrusterRows: 0 };
    const days = new Set<string>();

    // The publisher: per vessel, intervals in order, sent as single records or batches of 1–200.
    const publishing = (async () => {
      for (let i = 0; i < INTERVALS; ) {
        const size = rng.next() < 0.3 ? 1 : 1 + Math.floor(rng.next() * 200);
        const end = Math.min(INTERVALS, i + size);
        for (const key of keys) {
          const station = [];
          const thrusters = [];
          for (let k = i; k < end; k++) {
            const t = new Date(start + k * 5 * 60_000).toISOString(); // 5-minute steps: several days
            days.add(`${key}|${fleetDay(t, 'UTC')}`);
            station.push({ v: 1, t, dt: 60, mode: 'auto_position', dp_s: 60, n: 2, err: { hist: [1, 1] } });
            thrusters.push({ v: 1, t, dt: 60, units: [{ id: 'T1', run_s: 60, starts: 0 }, { id: 'T2', run_s: 0, starts: 0 }] });
          }
          const body = (records: unknown[]) => JSON.stringify(records.length === 1 ? records[0] : { records });
          await publisher.publishAsync(`${root}/${key}/station`, body(station), { qos: 1 });
          await publisher.publishAsync(`${root}/${key}/thrusters`, body(thrusters), { qos: 1 });
          published.station += station.length;
          published.thrusterRows += thrusters.length * 2;
        }
        i = end;
        await new Promise((r) => setTimeout(r, 5));
      }
    })();

    // The killer: SIGKILL at random moments, restart after a random pause.
    for (let kill = 0; kill < KILLS; kill++) {
      await new Promise((r) => setTimeout(r, 300 + rng.next() * 900));
      worker!.kill('SIGKILL');
      await new Promise((r) => setTimeout(r, 100 + rng.next() * 400));
      await startWorker();
    }
    await publishing;

    const counts = async () =>
      (
        await db.pool.query(
          `SELECT (SELECT count(*) FROM ts_station)::int AS station, (SELECT count(*) FROM ts_thruster)::int AS thrusters`,
        )
      ).rows[0] as { station: number; thrusters: number };
    await waitFor(
      async () => {
        const c = await counts();
        return c.station >= published.station && c.thrusters >= published.thrusterRows;
      },
      60_000,
      'every published record',
    ).catch(async (error: Error) => {
      const q = await db.pool.query('SELECT reason, count(*)::int AS n, min(detail) AS d FROM quarantine GROUP BY 1');
      throw new Error(`${error.message}: stored ${JSON.stringify(await counts())}, published ${JSON.stringify(published)}, quarantined ${JSON.stringify(q.rows)}\n${log.slice(-3000)}`);
    });
    // Settle, then compare exactly: a late redelivery must not add anything.
    await new Promise((r) => setTimeout(r, 1_000));
    expect(await counts()).toEqual({ station: keys.length * INTERVALS, thrusters: keys.length * INTERVALS * 2 });
    expect(published.station).toBe(keys.length * INTERVALS);

    const marked = await db.pool.query(
      `SELECT v.key || '|' || d.day AS k FROM dirty_day d JOIN vessel v ON v.id = d.vessel_id`,
    );
    expect(new Set(marked.rows.map((r) => r.k))).toEqual(days);
    expect(log).not.toMatch(/Error:|unhandled/i);
  }, 180_000);
});
