import mqtt, { type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { startStatusServer, type StatusServer } from '../ingest/statusServer';
import { IngestWorker } from '../ingest/worker';
import { createPool, type Pool } from '../lib/db/pool';
import { silentLogger } from '../lib/log/logger';
import { testWorker } from './helpers/testWorker';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/** The value of one series in a Prometheus text exposition (`name{labels} value`). */
function sample(text: string, series: string): number | undefined {
  const line = text.split('\n').find((l) => l.startsWith(series + ' '));
  return line === undefined ? undefined : Number(line.slice(series.length + 1));
}


const statusOf = (worker: IngestWorker) =>
  startStatusServer({ port: 0, metrics: worker.metrics, health: worker.health, log: silentLogger });

const station = (t: string) => ({ v: 1, t, dt: 60, mode: 'auto_position', dp_s: 60, n: 3, err: { hist: [1, 2] } });

describe('ingest metrics and health over HTTP, from a real worker', () => {
  const suffix = uniqueSuffix();
  const root = `obs-${suffix}/v1`;
  const key = `obs-${suffix}`;
  let db: TestDatabase;
  let worker: IngestWorker;
  let status: StatusServer;
  let publisher: MqttClient;
  let base: string;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(key));
    worker = testWorker(db.pool, `holdfast-obs-${suffix}`, root);
    await worker.start();
    status = await statusOf(worker);
    base = `http://127.0.0.1:${status.port}`;
    publisher = await mqtt.connectAsync(inject('mqttUrl'), { clientId: `obs-pub-${suffix}`, protocolVersion: 4 });
  });
  afterAll(async () => {
    await publisher?.endAsync();
    await status?.stop();
    await worker?.stop();
    await db?.drop();
  });

  const publish = (stream: string, body: unknown, vessel = key) =>
    publisher.publishAsync(`${root}/${vessel}/${stream}`, typeof body === 'string' ? body : JSON.stringify(body), { qos: 1 });

  it('counts messages, rows per stream, duplicates and rejections by reason exactly', async () => {
    // An hour late, as a small backlog would be.
    const t0 = Math.floor((Date.now() - 3600_000) / 60_000) * 60_000;
    const at = (minutes: number) => new Date(t0 + minutes * 60_000).toISOString();
    await publish('station', station(at(0))); //                                        1 row
    await publish('station', { records: [station(at(1)), station(at(2)), { ...station(at(3)), err: { hist: [5] } }] }); // 2 rows + invalid_record
    await publish('thrusters', { v: 1, t: at(0), dt: 60, units: [{ id: 'T1', run_s: 60, starts: 0 }, { id: 'T2', run_s: 60, starts: 0 }] }); // 2 rows
    await waitFor(() => worker.handler.counters.messages >= 3, 15_000, 'the first three messages');
    await publish('station', station(at(0))); //                                        duplicate
    await publish('station', '{ not json'); //                                          invalid_json
    await publish('station', station(at(4)), 'not-registered'); //                      unknown_vessel
    await publish('weather', station(at(4))); //                                        unknown_stream
    await publish('station', station(new Date(Date.now() + 3600_000).toISOString())); // future_timestamp
    await waitFor(() => worker.handler.counters.messages >= 8, 15_000, 'all eight messages');
    await waitFor(() => worker.subscriber.unacknowledged === 0, 5_000, 'the last acknowledgements');

    const res = await fetch(`${base}/metrics`);
    expect(res.status).toBe(200);
    expect(res.headers.get('content-type')).toMatch(/^text\/plain; version=0\.0\.4/);
    const text = await res.text();

    expect(sample(text, 'holdfast_ingest_messages_total')).toBe(8);
    expect(sample(text, 'holdfast_ingest_rows_stored_total{stream="station"}')).toBe(3);
    expect(sample(text, 'holdfast_ingest_rows_stored_total{stream="thrusters"}')).toBe(2);
    expect(sample(text, 'holdfast_ingest_rows_stored_total{stream="power"}')).toBe(0);
    expect(sample(text, 'holdfast_ingest_duplicates_total{stream="station"}')).toBe(1);
    expect(sample(text, 'holdfast_ingest_duplicates_total{stream="thrusters"}')).toBe(0);
    for (const reason of ['invalid_record', 'invalid_json', 'unknown_vessel', 'unknown_stream', 'future_timestamp']) {
      expect(sample(text, `holdfast_ingest_rejected_total{reason="${reason}"}`), reason).toBe(1);
    }
    expect(sample(text, 'holdfast_ingest_rejected_total{reason="store_rejected"}')).toBe(0);

    // Every flush reported: rows of all messages (records and rejections), one commit time each.
    const flushes = sample(text, 'holdfast_ingest_batch_rows_count')!;
    expect(flushes).toBeGreaterThan(0);
    expect(sample(text, 'holdfast_ingest_batch_rows_sum')).toBe(11);
    expect(sample(text, 'holdfast_ingest_commit_seconds_count')).toBe(flushes);
    expect(sample(text, 'holdfast_ingest_commit_seconds_sum')).toBeGreaterThan(0);
    // One lag per message with stored records (four), each about an hour.
    expect(sample(text, 'holdfast_ingest_lag_seconds_count')).toBe(4);
    expect(sample(text, 'holdfast_ingest_lag_seconds_bucket{le="900"}')).toBe(0);
    expect(sample(text, 'holdfast_ingest_lag_seconds_bucket{le="21600"}')).toBe(4);

    // At rest: nothing buffered, nothing waiting for an acknowledgement, connected.
    expect(sample(text, 'holdfast_ingest_buffer_rows')).toBe(0);
    expect(sample(text, 'holdfast_ingest_unacknowledged_messages')).toBe(0);
    expect(sample(text, 'holdfast_ingest_broker_connected')).toBe(1);
    expect(sample(text, 'process_resident_memory_bytes')).toBeGreaterThan(0);
  });

  it('answers /healthz with 200 while broker and database are fine, and 404 elsewhere', async () => {
    const res = await fetch(`${base}/healthz`);
    expect(res.status).toBe(200);
    expect(await res.json()).toEqual({ status: 'ok', broker: 'connected', database: 'ok', bufferRows: 0, unacknowledged: 0 });
    expect((await fetch(`${base}/nothing-here`)).status).toBe(404);
  });

  it('answers 503 naming the database when it cannot be reached, and the broker once disconnected', async () => {
    // A second worker whose store is a port where nothing listens.
    const unreachable: Pool = createPool('postgres://postgres@127.0.0.1:1/nowhere', { max: 1, connectTimeoutMs: 1_000 });
    const lost = testWorker(unreachable, `holdfast-obs-lost-${suffix}`, `obs-lost-${suffix}/v1`, { processMetrics: false });
    await lost.start();
    const lostStatus = await statusOf(lost);
    try {
      const res = await fetch(`http://127.0.0.1:${lostStatus.port}/healthz`);
      expect(res.status).toBe(503);
      const body = await res.json();
      expect(body).toMatchObject({ status: 'failing', broker: 'connected', database: 'unreachable', failing: ['database'] });
      expect(body.databaseError).toMatch(/ECONNREFUSED|connect/);

      await lost.stop();
      const after = await fetch(`http://127.0.0.1:${lostStatus.port}/healthz`);
      expect(after.status).toBe(503);
      expect(await after.json()).toMatchObject({ broker: 'disconnected', failing: ['broker', 'database'] });
    } finally {
      await lostStatus.stop();
      await lost.stop().catch(() => {});
      await unreachable.end();
    }
  });
});

describe('several ingest workers in one shared-subscription group', () => {
  const suffix = uniqueSuffix();
  const root = `share-${suffix}/v1`;
  const key = `share-${suffix}`;
  const RECORDS = 200;
  let db: TestDatabase;
  const workers: IngestWorker[] = [];

  beforeAll(async () => {
    if (!inject('mqttIsMosquitto')) return;
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(key));
  });
  afterAll(async () => {
    for (const w of workers) await w.stop();
    await db?.drop();
  });

  it.skipIf(!inject('mqttIsMosquitto'))(
    'split one fleet\'s traffic: every record stored exactly once, by both workers (Mosquitto only: the embedded aedes broker has no shared subscriptions)',
    async () => {
      for (const name of ['a', 'b']) {
        const w = testWorker(db.pool, `holdfast-share-${name}-${suffix}`, root, { sharedGroup: `ingest-${suffix}`, processMetrics: false });
        await w.start();
        workers.push(w);
      }
      const publisher = await mqtt.connectAsync(inject('mqttUrl'), { clientId: `share-pub-${suffix}` });
      try {
        const t0 = Date.UTC(2026, 10, 20);
        for (let i = 0; i < RECORDS; i++) {
          await publisher.publishAsync(`${root}/${key}/station`, JSON.stringify(station(new Date(t0 + i * 60_000).toISOString())), { qos: 1 });
        }
      } finally {
        await publisher.endAsync();
      }
      const stored = () => workers.reduce((n, w) => n + w.handler.counters.inserted, 0);
      await waitFor(() => stored() >= RECORDS, 20_000, `${RECORDS} stored records`);
      await new Promise((r) => setTimeout(r, 500)); // a stray second delivery would show now

      const rows = await db.pool.query(`SELECT count(*)::int AS n FROM ts_station`);
      expect(rows.rows[0].n).toBe(RECORDS);
      expect(stored()).toBe(RECORDS);
      expect(workers.reduce((n, w) => n + w.handler.counters.duplicates, 0)).toBe(0);
      for (const w of workers) expect(w.handler.counters.inserted, 'each worker took a share').toBeGreaterThan(0);
    },
  );
});
