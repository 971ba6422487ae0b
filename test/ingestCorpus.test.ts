import mqtt, { type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import type { IngestWorker } from '../ingest/worker';
import { readFleetFile } from '../lib/register/fleetFile';
import { buildBadInputCorpus, type CorpusCase } from './corpus/badInput';
import { testWorker } from './helpers/testWorker';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * The bad-input corpus (test/corpus/badInput.ts) end to end: every case is
 * published through a real broker to a running IngestWorker, each under a
 * vessel of its own, and then checked case by case — its quarantine rows
 * (reason, detail, in order) and its stored good records. Topics the
 * worker's subscription can never receive go to its message handler directly.
 */
describe('ingest worker against the bad-input corpus', () => {
  const suffix = uniqueSuffix();
  const root = `corpus-${suffix}/v1`;
  const corpus = buildBadInputCorpus(new Date());
  const vesselOf = (i: number) => `c${i}-${suffix}`;
  const finalVessel = `final-${suffix}`;
  const topicOf = (c: CorpusCase, i: number) => c.topic?.(root, vesselOf(i)) ?? `${root}/${vesselOf(i)}/${c.topicSuffix}`;
  const isWildcard = (topic: string) => /[+#]/.test(topic);
  const viaBroker = (c: CorpusCase) => c.delivered === undefined || (c.delivered === 'mosquitto' && inject('mqttIsMosquitto'));
  const finalRecord = { v: 1, t: '2026-11-20T12:00:00Z', dt: 60, mode: 'auto_position', dp_s: 60, n: 0 };

  let db: TestDatabase;
  let worker: IngestWorker;
  let publisher: MqttClient;
  const vesselIds = new Map<string, number>();
  let brokerMessages = 0;
  let directMessages = 0;

  const byName = (name: string) => {
    const i = corpus.findIndex((c) => c.name === name);
    if (i < 0) throw new Error(`no corpus case named "${name}"`);
    return { c: corpus[i]!, i, vesselId: vesselIds.get(vesselOf(i))!, topic: topicOf(corpus[i]!, i) };
  };

  beforeAll(async () => {
    const topics = corpus.map(topicOf);
    if (new Set(topics).size !== topics.length) throw new Error('two corpus cases share a topic: results could not be told apart');
    if (new Set(corpus.map((c) => c.name)).size !== corpus.length) throw new Error('two corpus cases share a name');

    db = await createMigratedDatabase();
    const template = smallFleet('template').vessels[0]!;
    const keys = [...corpus.map((_, i) => vesselOf(i)), finalVessel];
    await registerFleet(db.url, readFleetFile(JSON.stringify({ v: 1, vessels: keys.map((key) => ({ ...template, key, name: key })) })));
    const { rows } = await db.pool.query<{ id: number; key: string }>('SELECT id, key FROM vessel');
    for (const r of rows) vesselIds.set(r.key, r.id);

    worker = testWorker(db.pool, `holdfast-corpus-${suffix}`, root);
    await worker.start();
    publisher = await mqtt.connectAsync(inject('mqttUrl'), { clientId: `pub-corpus-${suffix}`, protocolVersion: 4 });

    // Everything that may legally be published goes through the broker, the
    // spoofed topics too: the subscription must not deliver those.
    for (const [i, c] of corpus.entries()) {
      const topic = topicOf(c, i);
      if (viaBroker(c)) brokerMessages += 1;
      if (!isWildcard(topic)) await publisher.publishAsync(topic, c.payload, { qos: 1 });
    }
    await publisher.publishAsync(`${root}/${finalVessel}/station`, JSON.stringify(finalRecord), { qos: 1 });
    brokerMessages += 1;
    await waitFor(
      async () =>
        worker.handler.counters.messages >= brokerMessages &&
        (await db.pool.query('SELECT 1 FROM ts_station WHERE vessel_id = $1', [vesselIds.get(finalVessel)])).rowCount === 1,
      120_000,
      `the worker to take all ${brokerMessages} delivered messages`,
    );

    for (const [i, c] of corpus.entries()) {
      if (viaBroker(c)) continue;
      await worker.handler.handle(topicOf(c, i), Buffer.isBuffer(c.payload) ? c.payload : Buffer.from(c.payload));
      directMessages += 1;
    }
  }, 240_000);

  afterAll(async () => {
    await publisher?.endAsync();
    await worker?.stop();
    await db?.drop();
  });

  it('has at least 200 cases, and covers every reason code', () => {
    expect(corpus.length).toBeGreaterThanOrEqual(200);
    const reasons = new Set(corpus.flatMap((c) => c.expect.map((e) => e.reason)));
    expect([...reasons].sort()).toEqual(
      [
        'bad_topic',
        'future_timestamp',
        'invalid_json',
        'invalid_payload',
        'invalid_record',
        'non_finite_number',
        'payload_too_large',
        'too_many_records',
        'unknown_stream',
        'unknown_vessel',
      ].sort(),
    );
  });

  it.for(corpus.map((c, i) => ({ ...c, i })))('$name', async (c) => {
    const { rows } = await db.pool.query<{ reason: string; detail: string }>(
      'SELECT reason, detail FROM quarantine WHERE topic = $1 ORDER BY id',
      [topicOf(c, c.i)],
    );
    const expected = c.expect.flatMap((e) => Array.from({ length: e.count ?? 1 }, () => e));
    expect(rows.map((r) => r.reason)).toEqual(expected.map((e) => e.reason));
    for (const [k, e] of expected.entries()) {
      if (typeof e.detail === 'string') expect(rows[k]!.detail).toBe(e.detail);
      else if (e.detail) expect(rows[k]!.detail).toMatch(e.detail);
    }

    const stored = await db.pool.query<{ n: number }>(
      `SELECT ((SELECT count(DISTINCT t) FROM ts_station WHERE vessel_id = $1) + (SELECT count(DISTINCT t) FROM ts_thruster WHERE vessel_id = $1)
             + (SELECT count(DISTINCT t) FROM ts_power WHERE vessel_id = $1) + (SELECT count(DISTINCT t) FROM ts_ref WHERE vessel_id = $1)
             + (SELECT count(DISTINCT t) FROM ts_track WHERE vessel_id = $1))::int AS n`,
      [vesselIds.get(vesselOf(c.i))],
    );
    expect(stored.rows[0]!.n).toBe(c.good ?? 0);
  });

  it('is still connected after the whole corpus, took every delivered message once and stored the final good record', async () => {
    expect(worker.subscriber.connected).toBe(true);
    expect(worker.handler.counters.messages).toBe(brokerMessages + directMessages);
    const final = await db.pool.query('SELECT mode, dp_s FROM ts_station WHERE vessel_id = $1', [vesselIds.get(finalVessel)]);
    expect(final.rows).toEqual([{ mode: 'auto_position', dp_s: 60 }]);
    // No message was refused by the database: everything bad was caught before it.
    expect(worker.handler.counters.byReason).not.toHaveProperty('store_rejected');
  });

  it('stores a record from 1990, in a partition created for it, and marks its day dirty', async () => {
    const { vesselId } = byName('t in the year 1990 (accepted, stored)');
    const row = await db.pool.query(`SELECT t FROM ts_station WHERE vessel_id = $1`, [vesselId]);
    expect(row.rows.map((r) => (r.t as Date).toISOString())).toEqual(['1990-06-15T12:00:00.000Z']);
    const part = await db.pool.query(`SELECT to_regclass('ts_station_p1990_06') IS NOT NULL AS exists`);
    expect(part.rows[0].exists).toBe(true);
    const dirty = await db.pool.query(`SELECT day FROM dirty_day WHERE vessel_id = $1`, [vesselId]);
    expect(dirty.rows.map((r) => r.day)).toEqual(['1990-06-15']);
  });

  it('stores missing optional fields as NULL, never 0', async () => {
    const station = byName('only the required station fields (accepted, the rest stored as NULL)');
    const s = await db.pool.query(
      `SELECT mode, dp_s, n, sp_lat, sp_hdg, err_r_rms, err_hist, hdg_err_mean, wind_ms, current_ms, residual_kn FROM ts_station WHERE vessel_id = $1`,
      [station.vesselId],
    );
    expect(s.rows).toEqual([
      { mode: 'standby', dp_s: 0, n: 0, sp_lat: null, sp_hdg: null, err_r_rms: null, err_hist: null, hdg_err_mean: null, wind_ms: null, current_ms: null, residual_kn: null },
    ]);

    const unit = byName('only id, run_s and starts (accepted, the rest stored as NULL)');
    const u = await db.pool.query(
      `SELECT unit_id, run_s, starts, rpm, pitch_pct, load_pct_mean, thrust_kn, power_kw, azimuth_deg, load_band_s FROM ts_thruster WHERE vessel_id = $1`,
      [unit.vesselId],
    );
    expect(u.rows).toEqual([
      { unit_id: 'T1', run_s: 0, starts: 0, rpm: null, pitch_pct: null, load_pct_mean: null, thrust_kn: null, power_kw: null, azimuth_deg: null, load_band_s: null },
    ]);

    const wind = byName('a failed wind sensor: env without wind fields (accepted)');
    const w = await db.pool.query(`SELECT wind_ms, wind_gust_ms, wind_from_deg, current_ms FROM ts_station WHERE vessel_id = $1`, [wind.vesselId]);
    expect(w.rows).toEqual([{ wind_ms: null, wind_gust_ms: null, wind_from_deg: null, current_ms: 0.3 }]);
  });

  it('ignores unknown fields and stores the known ones of the same record', async () => {
    const { vesselId } = byName('unknown extra fields at every level (accepted, ignored)');
    const r = await db.pool.query(`SELECT err_r_rms, err_hist, wind_ms FROM ts_station WHERE vessel_id = $1`, [vesselId]);
    expect(r.rows).toEqual([{ err_r_rms: 0.25, err_hist: [1, 2], wind_ms: 8 }]);
  });

  it('stores all units of the accepted borderline thruster records', async () => {
    for (const name of [
      'load bands 0.5 s over run_s (inside the 1 s tolerance, accepted)',
      'load bands exactly 1 s short of run_s (the tolerance is inclusive, accepted)',
    ]) {
      const { vesselId } = byName(name);
      const r = await db.pool.query(`SELECT unit_id FROM ts_thruster WHERE vessel_id = $1 ORDER BY unit_id`, [vesselId]);
      expect(r.rows.map((x) => x.unit_id)).toEqual(['T1', 'T2']);
    }
  });

  it('quarantines what the database could not hold as text: NUL bytes replaced, a too-deep record as its message text, a huge payload cut', async () => {
    const nul = byName('NUL bytes in the payload (quarantined, not a database error)');
    const q1 = await db.pool.query(`SELECT payload FROM quarantine WHERE topic = $1`, [nul.topic]);
    expect(q1.rows[0].payload).toBe((nul.c.payload as Buffer).toString('utf8').replaceAll('\u0000', '\uFFFD'));

    const deepRecord = byName('deeply nested arrays in an unknown field of a bad record (too deep to print back)');
    const q2 = await db.pool.query(`SELECT payload FROM quarantine WHERE topic = $1`, [deepRecord.topic]);
    expect(q2.rows[0].payload).toBe((deepRecord.c.payload as string).slice(0, 65_536));

    const big = byName('payload of 1 MiB + 1 byte');
    const q3 = await db.pool.query(`SELECT length(payload) AS chars, vessel_key, stream FROM quarantine WHERE topic = $1`, [big.topic]);
    expect(q3.rows).toEqual([{ chars: 65_536, vessel_key: vesselOf(big.i), stream: 'station' }]);
  });

  it('quarantines the offending record of a batch, not the whole batch', async () => {
    const { topic } = byName('station batch: good records beside bad ones');
    const q = await db.pool.query(`SELECT payload FROM quarantine WHERE topic = $1 ORDER BY id`, [topic]);
    const payloads = q.rows.map((r) => JSON.parse(r.payload));
    expect(payloads.slice(0, 2).map((p) => p.t)).toEqual(['2026-11-15T00:01:00Z', '2026-11-15T00:03:00Z']);
    expect(payloads.slice(4)).toEqual([null, 42]);
  });
});
