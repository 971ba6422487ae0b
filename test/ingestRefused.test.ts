import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IngestPipeline } from '../ingest/ingestPipeline';
import { MessageHandler } from '../ingest/messageHandler';
import { VesselDirectory } from '../ingest/vesselDirectory';
import { silentLogger } from '../lib/log/logger';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';

/**
 * A message that is valid by the contract but refused by the database must
 * not hold up the messages batched with it: the batch is retried message by
 * message, the refused one is quarantined as store_rejected, and every
 * message still settles (so its acknowledgement can go).
 */
describe('ingest pipeline, when the store refuses one message of a batch', () => {
  const key = `ref-${uniqueSuffix()}`;
  let db: TestDatabase;
  let pipeline: IngestPipeline;
  let handler: MessageHandler;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(key));
    // A rule the contract does not have, standing in for any refusal (a trigger, a full disk quota …).
    await db.pool.query('ALTER TABLE ts_station ADD CONSTRAINT test_refuse_long_dp CHECK (dp_s < 50)');
    handler = new MessageHandler(db.pool, new VesselDirectory(db.pool), { topicRoot: 'fleet/v1', fleetTimeZone: 'UTC' });
    pipeline = new IngestPipeline({ pool: db.pool, handler, fleetTimeZone: 'UTC', log: silentLogger, lingerMs: 200 });
  });
  afterAll(async () => db?.drop());

  it('stores the good messages, quarantines the refused one, and settles all of them', async () => {
    const record = (minute: number, dpS: number) =>
      Buffer.from(JSON.stringify({ v: 1, t: `2026-11-20T10:0${minute}:00Z`, dt: 60, mode: 'auto_position', dp_s: dpS, n: 0 }));
    const topic = `fleet/v1/${key}/station`;
    const submitted = [record(0, 30), record(1, 60), record(2, 40)].map((p) => pipeline.submit(topic, p));
    await Promise.all(submitted.map((s) => s.committed));

    const stored = await db.pool.query(`SELECT to_char(t AT TIME ZONE 'UTC', 'HH24:MI') AS at FROM ts_station ORDER BY t`);
    expect(stored.rows.map((r) => r.at)).toEqual(['10:00', '10:02']);
    const q = await db.pool.query('SELECT reason, stream, detail, payload FROM quarantine');
    expect(q.rows).toHaveLength(1);
    expect(q.rows[0]).toMatchObject({ reason: 'store_rejected', stream: 'station' });
    // The worker keeps a waiting message as rendered rows; the refused record is read again from its payload.
    expect(JSON.parse(q.rows[0].payload)).toEqual(JSON.parse(record(1, 60).toString()));
    expect(q.rows[0].detail).toMatch(/^records\[0\]: the store refused the message \(.*test_refuse_long_dp/);
    expect(handler.counters).toMatchObject({ messages: 3, inserted: 2, quarantined: 1 });
  });
});
