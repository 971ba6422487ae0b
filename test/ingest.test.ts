import mqtt, { type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { IngestWorker } from '../ingest/worker';
import { offsetFromSetPoint } from '../lib/geo/wgs84';
import { DemoVessel } from '../seed/demoTelemetry';
import { demoSite } from '../seed/sites';
import { testWorker } from './helpers/testWorker';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

describe('ingest worker, end to end through a real broker', () => {
  const suffix = uniqueSuffix();
  const root = `test-${suffix}/v1`;
  const key = `ing-${suffix}`;
  const fleet = smallFleet(key);
  let db: TestDatabase;
  let worker: IngestWorker;
  let publisher: MqttClient;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, fleet);
    worker = testWorker(db.pool, `holdfast-test-${suffix}`, root);
    await worker.start();
    publisher = await mqtt.connectAsync(inject('mqttUrl'), { clientId: `pub-${suffix}`, protocolVersion: 4 });
  });
  afterAll(async () => {
    await publisher?.endAsync();
    await worker?.stop();
    await db?.drop();
  });

  const publish = (stream: string, body: unknown, vessel = key) =>
    publisher.publishAsync(`${root}/${vessel}/${stream}`, typeof body === 'string' ? body : JSON.stringify(body), { qos: 1 });

  it('stores single records and batches of every statistics stream, and marks their days dirty', async () => {
    const demo = new DemoVessel(fleet.vessels[0]!, demoSite(0));
    const t0 = Date.UTC(2026, 10, 30, 23, 58);
    const intervals = [0, 1, 2, 3].map((k) => demo.interval(t0 + k * 60_000, 60)); // crosses midnight
    await publish('station', intervals[0]!.station);
    await publish('station', { records: intervals.slice(1).map((r) => r.station) });
    await publish('thrusters', { records: intervals.map((r) => r.thrusters) });
    await publish('power', { records: intervals.map((r) => r.power) });
    await publish('refs', { records: intervals.map((r) => r.refs) });
    await publish('track', {
      records: [
        { v: 1, t: '2026-11-30T23:58:00Z', lat: 59.1000090, lon: 2.5000175, hdg: 12, sp_lat: 59.1, sp_lon: 2.5, sp_hdg: 10 },
        { v: 1, t: '2026-11-30T23:58:01Z', lat: 59.1, lon: 2.5 },
      ],
    });

    await waitFor(() => worker.handler.counters.messages >= 6);
    const counts = await db.pool.query(`
      SELECT (SELECT count(*) FROM ts_station)::int AS station, (SELECT count(*) FROM ts_thruster)::int AS thrusters,
             (SELECT count(*) FROM ts_power)::int AS power, (SELECT count(*) FROM ts_ref)::int AS refs,
             (SELECT count(*) FROM ts_track)::int AS track`);
    expect(counts.rows[0]).toEqual({ station: 4, thrusters: 8, power: 8, refs: 8, track: 2 });

    // Track positions are stored with their north/east offsets from the set point (WGS84).
    const track = await db.pool.query(`SELECT north_m, east_m FROM ts_track ORDER BY t`);
    const expected = offsetFromSetPoint(59.100009, 2.5000175, 59.1, 2.5);
    expect(track.rows[0].north_m).toBeCloseTo(expected.north, 4);
    expect(track.rows[0].east_m).toBeCloseTo(expected.east, 4);
    expect(expected.north).toBeCloseTo(1.0, 1); // about 1 m north, 1 m east
    expect(expected.east).toBeCloseTo(1.0, 1);
    expect(track.rows[1]).toEqual({ north_m: null, east_m: null });

    const hist = await db.pool.query(`SELECT n, err_hist FROM ts_station ORDER BY t LIMIT 1`);
    expect(hist.rows[0].err_hist).toEqual(intervals[0]!.station.err!.hist);
    const bands = await db.pool.query(`SELECT load_band_s FROM ts_thruster WHERE unit_id = 'T1' ORDER BY t LIMIT 1`);
    expect(bands.rows[0].load_band_s).toEqual((intervals[0]!.thrusters.units[0] as { load_band_s: number[] }).load_band_s);

    const dirty = await db.pool.query(`SELECT day FROM dirty_day ORDER BY day`);
    expect(dirty.rows.map((r) => r.day)).toEqual(['2026-11-30', '2026-12-01']);
  });

  it('stores optional fields that were not sent as NULL, never 0', async () => {
    await publish('station', { v: 1, t: '2026-11-29T10:00:00Z', dt: 60, mode: 'standby', dp_s: 0, n: 0 });
    await waitFor(async () => (await db.pool.query(`SELECT 1 FROM ts_station WHERE t = '2026-11-29T10:00:00Z'`)).rowCount === 1);
    const row = await db.pool.query(`SELECT wind_ms, err_hist, sp_lat FROM ts_station WHERE t = '2026-11-29T10:00:00Z'`);
    expect(row.rows[0]).toEqual({ wind_ms: null, err_hist: null, sp_lat: null });
  });

  it('counts duplicates instead of storing them, quarantines bad input and keeps the good records beside it', async () => {
    const before = { ...worker.handler.counters };
    const good = { v: 1, t: '2026-11-28T10:00:00Z', dt: 60, mode: 'auto_position', dp_s: 60, n: 3, err: { hist: [1, 2] } };
    const badHist = { ...good, t: '2026-11-28T10:01:00Z', err: { hist: [5] } };
    const future = { ...good, t: new Date(Date.now() + 3600_000).toISOString() };
    await publish('station', { records: [good, badHist, good, future] });
    await publish('station', '{ not json');
    await publish('station', good, 'not-registered');
    await publish('weather', good);

    await waitFor(() => worker.handler.counters.messages >= before.messages + 4);
    expect(worker.handler.counters.inserted - before.inserted).toBe(1);
    expect(worker.handler.counters.duplicates - before.duplicates).toBe(1);
    // Messages are quarantined as their flushes commit, so rows of different messages may come in any order.
    const q = await db.pool.query(`SELECT reason, vessel_key, stream, detail FROM quarantine ORDER BY reason`);
    expect(q.rows.map((r) => r.reason)).toEqual([
      'future_timestamp',
      'invalid_json',
      'invalid_record',
      'unknown_stream',
      'unknown_vessel',
    ]);
    expect(q.rows.find((r) => r.reason === 'invalid_record').detail).toBe('records[1].err.hist: counts must add up to n (3)');
    const stored = await db.pool.query(`SELECT count(*)::int AS n FROM ts_station WHERE t = '2026-11-28T10:00:00Z'`);
    expect(stored.rows[0].n).toBe(1);
  });

  it('stores a 10,000-record backlog batch exactly, and marks out-of-order and days-late records on the right days', async () => {
    await db.pool.query('DELETE FROM dirty_day');
    // A store-and-forward backlog: 10,000 one-minute records, newest first, spanning 7 days up to 12 days ago.
    const end = Date.UTC(2026, 10, 19, 6, 0);
    const backlog = Array.from({ length: 10_000 }, (_, i) => ({
      v: 1, t: new Date(end - i * 60_000).toISOString().replace('.000', ''), dt: 60, mode: 'auto_position', dp_s: 60, n: 0,
    }));
    const before = worker.handler.counters.messages;
    const payload = JSON.stringify({ records: backlog });
    expect(Buffer.byteLength(payload)).toBeLessThan(1024 * 1024); // within the contract's 1 MiB
    await publish('station', payload);
    // Then a live record, and one late record of an earlier day, out of order.
    await publish('station', { v: 1, t: '2026-11-26T12:00:00Z', dt: 60, mode: 'standby', dp_s: 0, n: 0 });
    await publish('station', { v: 1, t: '2026-11-02T03:00:00Z', dt: 60, mode: 'standby', dp_s: 0, n: 0 });
    await waitFor(() => worker.handler.counters.messages >= before + 3, 30_000, 'the backlog');

    const stored = await db.pool.query(
      `SELECT count(*)::int AS n FROM ts_station WHERE t > $1::timestamptz - interval '7 days' AND t <= $1`,
      [new Date(end).toISOString()],
    );
    expect(stored.rows[0].n).toBe(10_000);
    const expectedDays = new Set(backlog.map((r) => r.t.slice(0, 10)));
    expectedDays.add('2026-11-26');
    expectedDays.add('2026-11-02');
    const marked = await db.pool.query(`SELECT day FROM dirty_day ORDER BY day`);
    expect(marked.rows.map((r) => r.day)).toEqual([...expectedDays].sort());
  });
});
