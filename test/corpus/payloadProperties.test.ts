import fc from 'fast-check';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { MessageHandler } from '../../ingest/messageHandler';
import { VesselDirectory } from '../../ingest/vesselDirectory';
import { parsePayload, MAX_RECORDS_PER_MESSAGE, type RejectReason } from '../../lib/telemetry/parsePayload';
import { createMigratedDatabase, type TestDatabase } from '../helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from '../helpers/fleet';

/**
 * Property-based fuzzing of payloads (fast-check): whatever arrives, reading
 * it never throws, and every item of it is accounted for — stored, counted
 * as a duplicate, or quarantined with one of the documented reasons — none
 * vanishes and none is counted twice. First on the parser alone (many runs),
 * then through the worker's message handler into a real database.
 */
const REASONS: RejectReason[] = [
  'bad_topic', 'unknown_stream', 'unknown_vessel', 'payload_too_large', 'invalid_json', 'invalid_payload',
  'too_many_records', 'invalid_record', 'non_finite_number', 'future_timestamp',
];

/** Items a payload holds as the contract counts them: the batch's entries, or the one body. */
function itemsIn(payload: Buffer): number {
  try {
    const body: unknown = JSON.parse(new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(payload));
    if (body && typeof body === 'object' && !Array.isArray(body) && 'records' in body) {
      const list = (body as { records: unknown }).records;
      return Array.isArray(list) && list.length <= MAX_RECORDS_PER_MESSAGE ? list.length : 1;
    }
  } catch {
    // not JSON: one rejection for the whole payload
  }
  return 1;
}

const goodStation = (minute: number) => ({ v: 1, t: new Date(Date.UTC(2026, 9, 1) + minute * 60_000).toISOString(), dt: 60, mode: 'manual', dp_s: 0, n: 1, err: { hist: [1] } });

/** A good station record with one field replaced by any JSON value (or removed), or extended by one. */
const mutatedStation = fc
  .tuple(
    fc.nat(100_000),
    fc.constantFrom('v', 't', 'dt', 'mode', 'dp_s', 'n', 'err', 'sp', 'env', 'extra'),
    fc.option(fc.jsonValue({ maxDepth: 3 }), { nil: undefined }),
  )
  .map(([minute, key, value]) => {
    const record: Record<string, unknown> = goodStation(minute);
    if (value === undefined) delete record[key];
    else record[key] = value;
    return record;
  });

const payloads = fc.oneof(
  fc.uint8Array({ maxLength: 300 }).map((b) => Buffer.from(b)),
  fc.jsonValue({ maxDepth: 4 }).map((v) => Buffer.from(JSON.stringify(v) ?? 'null')),
  mutatedStation.map((r) => Buffer.from(JSON.stringify(r))),
  fc.array(fc.oneof(mutatedStation, fc.nat(100_000).map(goodStation), fc.jsonValue({ maxDepth: 2 })), { maxLength: 30 }).map((records) => Buffer.from(JSON.stringify({ records }))),
  // Prefixes of a valid batch: truncated in transit.
  fc.tuple(fc.array(fc.nat(100_000).map(goodStation), { minLength: 1, maxLength: 5 }), fc.double({ min: 0, max: 1, noNaN: true })).map(([records, cut]) => {
    const text = JSON.stringify({ records });
    return Buffer.from(text.slice(0, Math.floor(cut * text.length)));
  }),
);

describe('payload fuzzing', () => {
  it('the parser accounts for every item of any payload and never throws', () => {
    fc.assert(
      fc.property(payloads, (payload) => {
        const parsed = parsePayload('station', payload, new Date());
        expect(parsed.records.length + parsed.rejected.length).toBe(itemsIn(payload));
        for (const r of parsed.rejected) expect(REASONS).toContain(r.reason);
        // What is accepted holds only finite numbers (the store's columns cannot hold others).
        for (const r of parsed.records) expect(JSON.stringify(r)).not.toMatch(/null/);
      }),
      { numRuns: 3000, seed: 20261202 },
    );
  });

  describe('through the message handler into PostgreSQL', () => {
    const key = `fuzz-${uniqueSuffix()}`;
    let db: TestDatabase;
    let handler: MessageHandler;

    beforeAll(async () => {
      db = await createMigratedDatabase();
      await registerFleet(db.url, smallFleet(key));
      handler = new MessageHandler(db.pool, new VesselDirectory(db.pool), { topicRoot: 'fuzz/v1', fleetTimeZone: 'UTC' });
    });
    afterAll(async () => db?.drop());

    it('stores or quarantines every item, and the tables agree with the counts', async () => {
      let quarantined = 0;
      let inserted = 0;
      await fc.assert(
        fc.asyncProperty(payloads, async (payload) => {
          const result = await handler.handle(`fuzz/v1/${key}/station`, payload);
          expect(result.inserted + result.duplicates + result.quarantined).toBe(itemsIn(payload));
          quarantined += result.quarantined;
          inserted += result.inserted;
        }),
        { numRuns: 150, seed: 20261203 },
      );
      const rows = await db.pool.query<{ q: number; s: number; bad: number }>(
        `SELECT (SELECT count(*) FROM quarantine)::int AS q, (SELECT count(*) FROM ts_station)::int AS s,
                (SELECT count(*) FROM quarantine WHERE NOT reason = ANY($1))::int AS bad`,
        [REASONS],
      );
      expect(rows.rows[0]).toEqual({ q: quarantined, s: inserted, bad: 0 });
      expect(inserted).toBeGreaterThan(0); // the fuzzing reached the store, not only the quarantine
    });
  });
});
