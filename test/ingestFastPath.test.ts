import { describe, expect, it } from 'vitest';
import { fastRecord } from '../lib/telemetry/fastRecord';
import { recordSchemas, STREAMS } from '../lib/telemetry/schemas';
import { buildBadInputCorpus } from './corpus/badInput';

/**
 * The ingest worker takes records through a hand-written fast path and asks
 * zod only when it fails (lib/telemetry/fastRecord.ts). Every record of the
 * bad-input corpus, read as every stream, must be accepted by the fast path
 * exactly when zod accepts it, with the same result. (test/ingestCorpus.test.ts
 * checks the quarantine rows the worker writes for the same corpus.)
 */
describe('fast path against zod on the bad-input corpus', () => {
  const corpus = buildBadInputCorpus(new Date());

  /** The records of a payload as the worker reads them, or none when it is not a JSON object. */
  const itemsOf = (payload: string | Buffer): unknown[] => {
    let body: unknown;
    try {
      body = JSON.parse(payload.toString());
    } catch {
      return [];
    }
    if (typeof body !== 'object' || body === null || Array.isArray(body)) return [];
    const list = (body as { records?: unknown }).records;
    return 'records' in body ? (Array.isArray(list) ? list : []) : [body];
  };

  it('agrees on every record of every case, read as every stream', () => {
    let accepted = 0;
    let refused = 0;
    for (const c of corpus) {
      for (const [i, item] of itemsOf(c.payload).entries()) {
        for (const stream of STREAMS) {
          const fast = fastRecord(stream, item);
          const zod = recordSchemas[stream].safeParse(item);
          expect(fast !== undefined, `${c.name}, record ${i}, as ${stream}`).toBe(zod.success);
          if (zod.success) expect(fast).toStrictEqual(zod.data);
          if (zod.success) accepted++;
          else refused++;
        }
      }
    }
    // The corpus exercises both sides.
    expect(accepted).toBeGreaterThan(20);
    expect(refused).toBeGreaterThan(200);
  });
});
