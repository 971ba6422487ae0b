import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import mqtt, { type MqttClient } from 'mqtt';
import pg from 'pg';
import { pgExecutor } from '../../lib/db/executor';
import { migrate } from '../../lib/db/migrate';
import { createPool, type Pool } from '../../lib/db/pool';
import { readFleetFile } from '../../lib/register/fleetFile';
import { fleetDay } from '../../lib/time/fleetDay';
import { Random } from '../../seed/random';
import { registerFleet, smallFleet } from '../helpers/fleet';
import { aedesFallback, privateMosquitto, privatePostgres, type PrivateService } from './privateServices';

/**
 * The ingest fault run: a publisher sends `records` telemetry records with
 * QoS 1 (single records and backlog `records` batches) to a `holdfast
 * ingest` process, while the worker is SIGKILLed `kills` times at random
 * moments and restarted, and the broker and the database are each
 * restarted once. Then the store is compared key by key with what was
 * published. Used by `npm run test:faults` (bench/faults.ts, a million
 * records) and by test/faults.test.ts (the same faults, fewer records).
 */
export interface FaultRunOptions {
  records: number;
  kills: number;
  seed: number;
  /** Share of messages that carry a single record (the rest are batches of 2–`maxBatch`). */
  singleShare?: number;
  maxBatch?: number;
  say?: (line: string) => void;
}

export interface FaultRunResult {
  published: number;
  stored: number;
  lost: number;
  duplicated: number;
  kills: number;
  brokerRestarts: number;
  databaseRestarts: number;
  /** Why the broker was not restarted (no Mosquitto here), if it was not. */
  brokerRestartSkipped?: string;
  daysTouched: number;
  daysMarked: number;
  /** Days that received records but carry no dirty mark, and marks on days that received none. */
  unmarkedDays: string[];
  strayMarks: string[];
  /** Worker exits we did not cause, and log lines that must not appear. */
  unexpectedExits: string[];
  alarmingLogLines: string[];
  /** Start-up retries the restarted workers logged (waiting for the database or broker). */
  startupRetries: number;
  /** Mean time from spawning a worker to its subscription, seconds. */
  meanStartSeconds: number;
  seconds: number;
}

const ROOT_DIR = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const VESSELS = 4;
const STREAMS = ['station', 'thrusters'] as const;
const START = Date.UTC(2026, 5, 1);
const STEP_MS = 60_000;
const TIME_ZONE = 'Europe/Oslo';
const WINDOW = 64; // QoS 1 messages the publisher keeps unacknowledged at once
const STALL_MS = Number(process.env.FAULTS_STALL_MS ?? 60_000); // no progress this long ends the wait
const LOG_KEEP = 400_000; // characters of worker output kept for diagnosis

type Stream = (typeof STREAMS)[number];
type Event = 'kill' | 'broker' | 'database';

const record = (stream: Stream, t: string) =>
  stream === 'station'
    ? { v: 1, t, dt: 60, mode: 'auto_position', dp_s: 60, n: 2, err: { r_mean: 0.4, hist: [1, 1] } }
    : { v: 1, t, dt: 60, units: [{ id: 'T1', run_s: 60, starts: 0, load_pct_mean: 31 }, { id: 'T2', run_s: 12, starts: 1 }] };

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));

export async function runFaults(options: FaultRunOptions): Promise<FaultRunResult> {
  const { records, kills, seed, singleShare = 0.5, maxBatch = 100, say = () => {} } = options;
  const rng = new Random(seed);
  const started = performance.now();
  const tag = `f${seed.toString(36).slice(-6)}`;
  const root = `faults-${tag}/v1`;
  const keys = Array.from({ length: VESSELS }, (_, i) => `faults-${tag}-${i}`);

  const db = await privatePostgres();
  const brokerOwn = await privateMosquitto();
  const broker: PrivateService = brokerOwn ?? (await aedesFallback());
  const brokerRestartSkipped = broker.restartable ? undefined : 'Mosquitto is not installed here; aedes keeps its queues in memory, so a restart would lose them by design';
  say(`store: ${db.label}; broker: ${broker.label}`);
  if (brokerRestartSkipped) say(`broker restart SKIPPED: ${brokerRestartSkipped}`);

  const dbUrl = await createDatabase(db.url, `holdfast_${tag}`);
  let pool: Pool | undefined;
  let worker: ChildProcess | undefined;
  let publisher: MqttClient | undefined;
  const unexpectedExits: string[] = [];
  let log = '';
  let startupRetries = 0;
  const startTimes: number[] = [];
  try {
    await registerFleet(dbUrl, readFleetFile(JSON.stringify({ v: 1, vessels: keys.map((key) => ({ ...smallFleet(key).vessels[0], key, name: key })) })));
    pool = createPool(dbUrl, 2);
    const { rows: vesselRows } = await pool.query<{ id: number; key: string }>('SELECT id, key FROM vessel ORDER BY key');

    // --- the worker process -------------------------------------------------
    let killing = false;
    let stopping = false; // the clean stop at the end
    const startWorker = (): Promise<void> => {
      const child = spawn(process.execPath, [path.join(ROOT_DIR, 'bin/holdfast.mjs'), 'ingest'], {
        cwd: ROOT_DIR,
        env: {
          ...process.env,
          DATABASE_URL: dbUrl,
          MQTT_URL: broker.url,
          MQTT_TOPIC_ROOT: root,
          MQTT_CLIENT_ID: `holdfast-faults-${tag}`,
          FLEET_TIME_ZONE: TIME_ZONE,
          LOG_LEVEL: 'info',
          LOG_FORMAT: 'text',
          HOLDFAST_METRICS_PORT: '0',
        },
        stdio: ['ignore', 'pipe', 'pipe'],
      });
      worker = child;
      const spawnedAt = performance.now();
      return new Promise((resolve, reject) => {
        let own = '';
        let subscribed = false;
        const onData = (d: Buffer) => {
          const text = d.toString();
          own += text;
          log = (log + text).slice(-LOG_KEEP);
          startupRetries += text.match(/unreachable at start/g)?.length ?? 0;
          if (!subscribed && own.includes('subscribed to')) {
            subscribed = true;
            startTimes.push((performance.now() - spawnedAt) / 1000);
            clearTimeout(slow);
            resolve();
          }
        };
        child.stdout!.on('data', onData);
        child.stderr!.on('data', onData);
        const slow = setTimeout(() => say(`the worker has not subscribed after 30 s:\n${own.slice(-3000)}`), 30_000);
        child.once('exit', () => clearTimeout(slow));
        void new Promise((r) => child.stdout!.once('close', r)).then(() => clearTimeout(slow));
        child.once('exit', (code, signal) => {
          if (killing && signal === 'SIGKILL') return;
          if (stopping && code === 0) return;
          const why = `worker exited by itself (code ${code}, signal ${signal}): ${own.slice(-1500)}`;
          unexpectedExits.push(why);
          say(why);
          reject(new Error(why));
        });
      });
    };
    await startWorker();
    say('worker started; publishing');

    // --- the faults, at random points of the stream ---------------------------
    const events: { at: number; kind: Event }[] = [
      ...Array.from({ length: kills }, () => 'kill' as const),
      ...(broker.restartable ? ['broker' as const] : []),
      'database' as const,
    ].map((kind) => ({ kind, at: Math.floor(records * (0.03 + 0.92 * rng.next())) }));
    events.sort((a, b) => a.at - b.at);
    const done = { kills: 0, broker: 0, database: 0 };
    const runEvent = async (kind: Event) => {
      await sleep(rng.next() * 150); // not exactly at a message boundary of the publisher
      say(`${((performance.now() - started) / 1000).toFixed(1)} s: ${kind === 'kill' ? 'SIGKILL the worker' : `restart the ${kind}`} at ${publishedSoFar} records published`);
      if (kind === 'kill') {
        const victim = worker!;
        killing = true;
        if (victim.exitCode === null && victim.signalCode === null) {
          const exited = new Promise((r) => victim.once('exit', r));
          victim.kill('SIGKILL');
          await exited;
        }
        killing = false;
        done.kills++;
        await sleep(20 + rng.next() * 200); // a supervisor restarting it
        await startWorker();
      } else if (kind === 'broker') {
        await broker.stop();
        await sleep(500 + rng.next() * 1500);
        await broker.start();
        done.broker++;
      } else {
        await db.stop();
        await sleep(1000 + rng.next() * 2000);
        await db.start();
        done.database++;
      }
    };

    // --- the publisher ------------------------------------------------------------
    publisher = await mqtt.connectAsync(broker.url, { clientId: `faults-pub-${tag}`, clean: false, protocolVersion: 4, reconnectPeriod: 250 });
    publisher.on('error', () => {}); // reconnects by itself; a refused publish is sent again below
    const next = new Map<string, number>(); // (vessel, stream) → next interval index = records sent so far
    const days = new Set<string>();
    let publishedSoFar = 0; // records whose message the broker acknowledged
    let generated = 0;
    let outstanding = 0;
    let pending: Promise<void> | undefined;
    let eventIndex = 0;
    const failures: Error[] = [];

    const publish = (topic: string, body: string, count: number) =>
      new Promise<void>((resolve) => {
        let acknowledged = false;
        const attempt = () =>
          publisher!.publish(topic, body, { qos: 1 }, (error) => {
            if (acknowledged) return;
            // Refused (e.g. the client was closed by a broker restart): send it again; a second copy is harmless.
            if (error) return void setTimeout(attempt, 200);
            acknowledged = true;
            publishedSoFar += count;
            resolve();
          });
        attempt();
      });

    while (generated < records) {
      // A fault whose moment has come starts now and runs beside the publisher; the next waits for it.
      while (eventIndex < events.length && events[eventIndex]!.at <= generated) {
        await pending;
        pending = runEvent(events[eventIndex]!.kind).catch((error: Error) => void failures.push(error));
        eventIndex++;
      }
      if (failures.length) throw failures[0];
      const vessel = keys[Math.floor(rng.next() * VESSELS)]!;
      const stream = STREAMS[Math.floor(rng.next() * STREAMS.length)]!;
      const size = Math.min(records - generated, rng.next() < singleShare ? 1 : 2 + Math.floor(rng.next() * (maxBatch - 1)));
      const k0 = next.get(`${vessel}|${stream}`) ?? 0;
      const batch = [];
      for (let k = k0; k < k0 + size; k++) {
        const t = new Date(START + k * STEP_MS).toISOString();
        days.add(`${vessel}|${fleetDay(t, TIME_ZONE)}`);
        batch.push(record(stream, t));
      }
      next.set(`${vessel}|${stream}`, k0 + size);
      generated += size;
      const body = JSON.stringify(size === 1 ? batch[0] : { records: batch });
      while (outstanding >= WINDOW) await sleep(1);
      outstanding++;
      void publish(`${root}/${vessel}/${stream}`, body, size).then(() => outstanding--);
      // Keep the stream going long enough for the faults to land across it.
      if (generated % 2000 < size) await sleep(1);
    }
    await pending;
    if (failures.length) throw failures[0];
    while (outstanding > 0) await sleep(10);
    say(`published ${publishedSoFar} records; waiting for the store`);

    // --- compare -------------------------------------------------------------
    const ids = new Map(vesselRows.map((r) => [r.key, r.id]));
    const countsFor = (stream: Stream) => ({
      vessels: keys.map((k) => ids.get(k)!),
      counts: keys.map((k) => next.get(`${k}|${stream}`) ?? 0),
    });
    // Wait on a cheap count (the key-by-key comparison reads every row once, at the end).
    const rowsAsRecords = async () =>
      (await pool!.query<{ n: number }>('SELECT ((SELECT count(*) FROM ts_station) + (SELECT count(*) FROM ts_thruster) / 2)::int AS n')).rows[0]!.n;
    let last = -1;
    let lastChange = Date.now();
    for (;;) {
      if (unexpectedExits.length) break;
      const n = await rowsAsRecords();
      if (n >= records) break;
      if (n !== last) {
        last = n;
        lastChange = Date.now();
      } else if (Date.now() - lastChange > STALL_MS) {
        say(`the store stopped growing at ${n} of ${records} records; the worker's last words:\n${log.slice(-4000)}`);
        break;
      }
      await sleep(1000);
    }
    await sleep(1000); // a late redelivery must not add anything
    const final = await storeTally(pool, countsFor('station'), countsFor('thrusters'));

    const { rows: marks } = await pool.query<{ k: string }>(`SELECT v.key || '|' || d.day AS k FROM dirty_day d JOIN vessel v ON v.id = d.vessel_id`);
    const marked = new Set(marks.map((r) => r.k));

    // A clean stop at the end: the worker must leave on SIGTERM, not be killed.
    stopping = true;
    const last1 = worker!;
    const stopped = new Promise((r) => last1.once('exit', r));
    last1.kill('SIGTERM');
    await Promise.race([stopped, sleep(15_000).then(() => unexpectedExits.push('the worker did not stop within 15 s of SIGTERM'))]);

    return {
      published: publishedSoFar,
      stored: final.stored,
      lost: records - final.matched,
      duplicated: final.extra,
      kills: done.kills,
      brokerRestarts: done.broker,
      databaseRestarts: done.database,
      brokerRestartSkipped,
      daysTouched: days.size,
      daysMarked: marked.size,
      unmarkedDays: [...days].filter((d) => !marked.has(d)),
      strayMarks: [...marked].filter((d) => !days.has(d)),
      unexpectedExits,
      alarmingLogLines: log.split('\n').filter((line) => /unhandled|TypeError|ReferenceError|RangeError|could be neither stored nor quarantined|flush failed unexpectedly/i.test(line)),
      startupRetries,
      meanStartSeconds: startTimes.reduce((a, b) => a + b, 0) / Math.max(1, startTimes.length),
      seconds: (performance.now() - started) / 1000,
    };
  } finally {
    if (worker && worker.exitCode === null && worker.signalCode === null) worker.kill('SIGKILL');
    await publisher?.endAsync(true).catch(() => {});
    await pool?.end().catch(() => {});
    await broker.close().catch(() => {});
    await db.close().catch(() => {});
  }
}

async function createDatabase(serverUrl: string, name: string): Promise<string> {
  const admin = new pg.Client({ connectionString: serverUrl });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name}`);
  await admin.end();
  const u = new URL(serverUrl);
  u.pathname = `/${name}`;
  const url = u.toString();
  const pool = createPool(url, 1);
  const client = await pool.connect();
  try {
    await migrate(pgExecutor(client), { store: 'partitions' });
  } finally {
    client.release();
    await pool.end();
  }
  return url;
}

interface StreamCounts {
  vessels: number[];
  counts: number[];
}

/**
 * The store against the published keys: every record is (vessel, t) at one
 * of the first `count` minutes after START for its vessel and stream; a
 * thruster record is stored when both of its units are. `matched` records
 * are present as published; `extra` counts stored rows and keys beyond
 * that (a key never published, or a record stored more than once). One
 * pass over each table: a key is "published" when its t lies on the minute
 * grid inside its vessel's range (a join against a generated list of a
 * million keys took minutes on partitioned tables).
 */
async function storeTally(pool: Pool, station: StreamCounts, thrusters: StreamCounts) {
  const published = (table: string, vessels: string, counts: string) => `
    SELECT k.vessel_id, k.t, k.rows, m.k IS NOT NULL AND m.k = floor(m.k) AND m.k >= 0 AND m.k < e.n AS published
      FROM (SELECT vessel_id, t, count(*)::int AS rows FROM ${table} GROUP BY 1, 2) AS k
      LEFT JOIN unnest(${vessels}::int[], ${counts}::int[]) AS e(vessel, n) ON e.vessel = k.vessel_id
      CROSS JOIN LATERAL (SELECT extract(epoch FROM k.t - to_timestamp(${START / 1000})) / ${STEP_MS / 1000} AS k) AS m`;
  const { rows } = await pool.query<{ s_rows: number; s_keys: number; s_matched: number; t_rows: number; t_keys: number; t_matched: number }>(
    `WITH s AS (${published('ts_station', '$1', '$2')}), th AS (${published('ts_thruster', '$3', '$4')})
     SELECT (SELECT coalesce(sum(rows), 0) FROM s)::int AS s_rows,
            (SELECT count(*) FROM s)::int AS s_keys,
            (SELECT count(*) FROM s WHERE published AND rows = 1)::int AS s_matched,
            (SELECT coalesce(sum(rows), 0) FROM th)::int AS t_rows,
            (SELECT count(*) FROM th)::int AS t_keys,
            (SELECT count(*) FROM th WHERE published AND rows = 2)::int AS t_matched`,
    [station.vessels, station.counts, thrusters.vessels, thrusters.counts],
  );
  const r = rows[0]!;
  return {
    matched: r.s_matched + r.t_matched,
    stored: r.s_keys + r.t_keys,
    // Keys never published, plus rows beyond one per key (station) or two per key (thrusters).
    extra: r.s_keys - r.s_matched + (r.t_keys - r.t_matched) + (r.s_rows - r.s_keys) + Math.max(0, r.t_rows - 2 * r.t_keys),
  };
}
