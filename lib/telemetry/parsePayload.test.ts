import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MAX_FUTURE_MS, MAX_PAYLOAD_BYTES, MAX_RECORDS_PER_MESSAGE, parsePayload, type RejectReason } from './parsePayload';
import { recordSchemas, STREAMS, type Stream } from './schemas';

const now = new Date('2026-11-15T12:00:00Z');
const bytes = (value: unknown) => Buffer.from(typeof value === 'string' ? value : JSON.stringify(value));
const station = (t = '2026-11-15T11:00:00Z', extra: object = {}) => ({
  v: 1,
  t,
  dt: 60,
  mode: 'auto_position',
  dp_s: 30,
  n: 3,
  err: { r_rms: 0.2, hist: [1, 2] },
  ...extra,
});

/** One valid record per stream, for the property tests to mutate. */
const validRecords: Record<Stream, Record<string, unknown>> = {
  station: station(),
  thrusters: {
    v: 1,
    t: '2026-11-15T11:00:00Z',
    dt: 60,
    units: [
      { id: 'T1', run_s: 60, starts: 1, rpm: 120, pitch_pct: -20, load_band_s: [0, 0, 30, 30, 0, 0, 0, 0, 0, 0, 0] },
      { id: 'T2', run_s: 0, starts: 0 },
    ],
  },
  power: { v: 1, t: '2026-11-15T11:00:00Z', dt: 60, buses: [{ id: 'A', kw_mean: 500, limit_s: 3, limit_events: 1, blackout: false }] },
  refs: { v: 1, t: '2026-11-15T11:00:00Z', dt: 60, systems: [{ id: 'GNSS1', kind: 'gnss', online_s: 60, weight: 1, sd_m: 0.2, rejected: 0 }] },
  track: { v: 1, t: '2026-11-15T11:00:00Z', lat: -33.9, lon: 151.2, hdg: 359.9 },
};

const WHOLE_PAYLOAD_REASONS: RejectReason[] = ['payload_too_large', 'invalid_json', 'invalid_payload', 'too_many_records'];
const RECORD_REASONS: RejectReason[] = ['invalid_record', 'non_finite_number', 'future_timestamp'];

describe('parsePayload', () => {
  it('returns a single valid record without its unknown fields, and leaves missing optional fields undefined', () => {
    const result = parsePayload('station', bytes(station(undefined, { firmware: '1.2', err: { hist: [1, 2], p99: 3 } })), now);
    expect(result.rejected).toEqual([]);
    expect(result.records).toEqual([{ v: 1, t: '2026-11-15T11:00:00Z', dt: 60, mode: 'auto_position', dp_s: 30, n: 3, err: { hist: [1, 2] } }]);
    expect(Object.keys(result.records[0]!)).not.toContain('sp');
  });

  it('names a bad single record "record" and a bad batch record by its index, with the record as payload', () => {
    const bad = station(undefined, { dp_s: -1 });
    expect(parsePayload('station', bytes(bad), now).rejected).toEqual([
      { reason: 'invalid_record', detail: 'record.dp_s: Too small: expected number to be >=0', payload: bad },
    ]);
    expect(parsePayload('station', bytes({ records: [bad] }), now).rejected).toEqual([
      { reason: 'invalid_record', detail: 'records[0].dp_s: Too small: expected number to be >=0', payload: bad },
    ]);
    const batch = parsePayload('station', bytes({ records: [station('2026-11-15T10:00:00Z'), bad, station('2026-11-15T10:02:00Z')] }), now);
    expect(batch.records.map((r) => r.t)).toEqual(['2026-11-15T10:00:00Z', '2026-11-15T10:02:00Z']);
    expect(batch.rejected.map((r) => r.detail)).toEqual(['records[1].dp_s: Too small: expected number to be >=0']);
  });

  it('counts the payload limit in bytes, not characters', () => {
    const record = JSON.stringify(station(undefined, { note: 'Ø'.repeat(1000) })); // 2 bytes per Ø
    const exact = record + ' '.repeat(MAX_PAYLOAD_BYTES - Buffer.byteLength(record));
    expect(Buffer.byteLength(exact)).toBe(MAX_PAYLOAD_BYTES);
    expect(parsePayload('station', Buffer.from(exact), now).records).toHaveLength(1);

    const over = Buffer.from(exact + ' ');
    expect(over.toString('utf8').length).toBeLessThan(MAX_PAYLOAD_BYTES); // fewer characters than the limit…
    const result = parsePayload('station', over, now);
    expect(result.records).toEqual([]);
    expect(result.rejected.map((r) => [r.reason, r.detail])).toEqual([
      ['payload_too_large', `payload is ${MAX_PAYLOAD_BYTES + 1} bytes; the limit is ${MAX_PAYLOAD_BYTES}`],
    ]);
    // …and the quarantined text is cut to 64 KiB.
    expect(result.rejected[0]!.payload).toBe(over.subarray(0, 65_536).toString('utf8'));
  });

  it('takes 10,000 records in one batch and refuses 10,001', () => {
    const records = Array.from({ length: MAX_RECORDS_PER_MESSAGE }, (_, i) => ({ v: 1, t: new Date(Date.UTC(2026, 10, 1) + i * 1000).toISOString(), lat: 1, lon: 2 }));
    expect(parsePayload('track', bytes({ records }), now).records).toHaveLength(10_000);
    const more = parsePayload('track', bytes({ records: [...records, records[0]] }), now);
    expect(more.records).toEqual([]);
    expect(more.rejected.map((r) => [r.reason, r.detail])).toEqual([['too_many_records', '10001 records; the limit is 10000 per message']]);
  });

  it('accepts t up to exactly 5 minutes ahead of the shore clock, and refuses one millisecond more', () => {
    const edge = new Date(now.getTime() + MAX_FUTURE_MS).toISOString();
    const beyond = new Date(now.getTime() + MAX_FUTURE_MS + 1).toISOString();
    const result = parsePayload('track', bytes({ records: [{ v: 1, t: edge, lat: 0, lon: 0 }, { v: 1, t: beyond, lat: 0, lon: 0 }] }), now);
    expect(result.records.map((r) => r.t)).toEqual([edge]);
    expect(result.rejected.map((r) => [r.reason, r.detail])).toEqual([
      ['future_timestamp', `records[1].t: ${beyond} is more than 5 minutes ahead of the shore clock`],
    ]);
  });

  it('refuses a payload that is not valid UTF-8 as invalid_json, and reads multi-byte UTF-8', () => {
    const good = Buffer.from(JSON.stringify(station(undefined, { note: 'Ålesund → Bergen' })));
    expect(parsePayload('station', good, now).records).toHaveLength(1);
    for (const bad of [[0xff], [0xc3, 0x28], [0xed, 0xa0, 0x80] /* a UTF-16 surrogate */, [0xf4, 0x90, 0x80, 0x80] /* beyond U+10FFFF */]) {
      const payload = Buffer.concat([good.subarray(0, 20), Buffer.from(bad), good.subarray(20)]);
      expect(parsePayload('station', payload, now).rejected.map((r) => [r.reason, r.detail])).toEqual([['invalid_json', 'payload is not valid UTF-8']]);
    }
  });

  it('calls a record with an infinite number non_finite_number, and names that field even when another one is bad too', () => {
    const raw = (text: string) => parsePayload('station', Buffer.from(text), now).rejected.map((r) => [r.reason, r.detail]);
    const s = JSON.stringify(station());
    expect(raw(s.replace('"dp_s":30', '"dp_s":1e999'))).toEqual([['non_finite_number', 'record.dp_s: Invalid input: expected number, received Infinity']]);
    expect(raw(s.replace('"dp_s":30', '"dp_s":-1e999').replace('"n":3', '"n":-3'))).toEqual([
      ['non_finite_number', 'record.dp_s: Invalid input: expected number, received -Infinity'],
    ]);
    expect(raw(s.replace('"t":"2026-11-15T11:00:00Z"', '"t":1e999'))).toEqual([['non_finite_number', 'record.t: Invalid input: expected string, received Infinity']]);
    expect(raw(s.replace('"mode":"auto_position"', '"mode":1e400'))[0]![0]).toBe('non_finite_number');
    expect(raw(s.replace('"hist":[1,2]', '"hist":[1,3e308]'))).toEqual([['non_finite_number', 'record.err.hist.1: Invalid input: expected number, received Infinity']]);
    // An unknown field is ignored, whatever it holds.
    expect(parsePayload('station', Buffer.from(s.replace('"v":1', '"v":1,"spare":1e999')), now).records).toHaveLength(1);
  });

  it('survives nesting deeper than any stack: 500,000 levels of arrays, and 200,000 inside an unknown field', () => {
    const deep = (n: number) => '['.repeat(n) + ']'.repeat(n);
    expect(parsePayload('station', Buffer.from(deep(500_000)), now).rejected.map((r) => r.reason)).toEqual(['invalid_payload']);
    expect(parsePayload('station', Buffer.from('['.repeat(500_000)), now).rejected.map((r) => r.reason)).toEqual(['invalid_json']);
    const inUnknown = JSON.stringify(station()).replace('"v":1', `"v":1,"x":${deep(200_000)}`);
    expect(parsePayload('station', Buffer.from(inUnknown), now).records).toHaveLength(1);
  });
});

// ---------------------------------------------------------------------------
// Properties: nothing makes parsePayload throw, and every input item is
// accounted for — stored or rejected, never both, never lost.

/** What the contract says one payload value holds: a whole-payload rejection, or this many records. */
function expectedItems(value: unknown): number | 'whole' {
  if (typeof value !== 'object' || value === null || Array.isArray(value)) return 'whole';
  if (!Object.hasOwn(value, 'records')) return 1;
  const list = (value as { records: unknown }).records;
  return Array.isArray(list) && list.length <= MAX_RECORDS_PER_MESSAGE ? list.length : 'whole';
}

function checkAccounting(stream: Stream, payload: Buffer, items: number | 'whole') {
  const result = parsePayload(stream, payload, now);
  if (items === 'whole') {
    expect(result.records).toEqual([]);
    expect(result.rejected).toHaveLength(1);
    expect(WHOLE_PAYLOAD_REASONS).toContain(result.rejected[0]!.reason);
    expect(typeof result.rejected[0]!.payload).toBe('string');
    return result;
  }
  expect(result.records.length + result.rejected.length).toBe(items);
  // Each rejection names a distinct record, in order.
  const indexes = result.rejected.map((r) => {
    expect(RECORD_REASONS).toContain(r.reason);
    const m = /^(?:record|records\[(\d+)\])[.:]/.exec(r.detail);
    expect(m, r.detail).not.toBeNull();
    return m![1] === undefined ? 0 : Number(m![1]);
  });
  for (const [k, i] of indexes.entries()) {
    expect(i).toBeLessThan(items);
    if (k > 0) expect(i).toBeGreaterThan(indexes[k - 1]!);
  }
  // What is accepted really is valid, and stays so when read again.
  for (const record of result.records) expect(recordSchemas[stream].safeParse(record).success).toBe(true);
  return result;
}

const streamArb = fc.constantFrom(...STREAMS);

/** A valid record of `stream` with one field (top level or nested) replaced by an arbitrary value, or removed. */
function mutatedRecord(stream: Stream) {
  const base = validRecords[stream];
  const paths: string[][] = [];
  const walk = (v: unknown, path: string[]) => {
    if (path.length) paths.push(path);
    if (v !== null && typeof v === 'object') for (const [k, child] of Object.entries(v)) walk(child, [...path, k]);
  };
  walk(base, []);
  const replacement = fc.oneof(
    fc.jsonValue({ maxDepth: 2 }),
    fc.constantFrom(0, -0, -1, 0.5, 1.5, 60, 61, 3600, 3601, 101, 361, 1e-50, 1e-40, 3.5e38, 2 ** 31, '60', true, null, [], {}),
    fc.constantFrom('2026-02-30T00:00:00Z', '2026-11-15T11:00:00', '2026-11-15T11:00:00.1234Z', '1990-01-01T00:00:00Z', '2026-11-15T12:06:00Z'),
    fc.constant(undefined),
  );
  return fc.record({ path: fc.constantFrom(...paths), value: replacement }).map(({ path, value }) => {
    const copy = structuredClone(base) as Record<string, unknown>;
    let target = copy;
    for (const key of path.slice(0, -1)) target = target[key] as Record<string, unknown>;
    if (value === undefined) delete target[path.at(-1)!];
    else target[path.at(-1)!] = value;
    return copy;
  });
}

describe('parsePayload properties', () => {
  it('arbitrary byte strings never throw, and end as one whole-payload rejection or records + rejections for every item', () => {
    const byteStrings = fc.oneof(
      fc.uint8Array({ maxLength: 512 }),
      fc.string({ unit: 'binary', maxLength: 256 }).map((s) => new Uint8Array(Buffer.from(s))),
      // Valid JSON with a few bytes overwritten, cut short, or lengthened.
      fc
        .tuple(fc.jsonValue({ maxDepth: 3 }), fc.array(fc.tuple(fc.nat(), fc.integer({ min: 0, max: 255 })), { maxLength: 3 }), fc.nat())
        .map(([value, edits, cut]) => {
          const b = Buffer.from(JSON.stringify({ records: [value] }));
          for (const [at, byte] of edits) b[at % b.length] = byte;
          return new Uint8Array(b.subarray(0, b.length - (cut % 3)));
        }),
    );
    fc.assert(
      fc.property(streamArb, byteStrings, (stream, raw) => {
        const payload = Buffer.from(raw);
        let value: unknown;
        let parses = true;
        try {
          value = JSON.parse(new TextDecoder('utf-8', { fatal: true, ignoreBOM: true }).decode(payload));
        } catch {
          parses = false;
        }
        const result = checkAccounting(stream, payload, parses ? expectedItems(value) : 'whole');
        if (!parses) expect(result.rejected[0]!.reason).toBe('invalid_json');
      }),
      { numRuns: 2000 },
    );
  });

  it('arbitrary JSON values never throw, and account for every item', () => {
    const values = fc.oneof(
      fc.jsonValue(),
      fc.array(fc.jsonValue({ maxDepth: 3 }), { maxLength: 20 }).map((records) => ({ records })),
      fc.dictionary(fc.string(), fc.jsonValue({ maxDepth: 2 })).map((d) => ({ ...d, records: d.records ?? [] })),
    );
    fc.assert(
      fc.property(streamArb, values, (stream, value) => {
        checkAccounting(stream, Buffer.from(JSON.stringify(value)), expectedItems(value));
      }),
      { numRuns: 2000 },
    );
  });

  it('batches of mutated valid records, 1e999 included, never throw, and keep exactly the valid ones', () => {
    const batch = streamArb.chain((stream) =>
      fc.tuple(
        fc.constant(stream),
        fc.array(fc.oneof(mutatedRecord(stream), fc.constant(validRecords[stream])), { minLength: 1, maxLength: 12 }),
        fc.array(fc.nat(), { maxLength: 2 }),
      ),
    );
    fc.assert(
      fc.property(batch, ([stream, records, infinities]) => {
        // Put 1e999 in place of some numbers of the JSON text.
        let text = JSON.stringify({ records });
        const numbers = [...text.matchAll(/(?<=[:,[])-?\d+(?:\.\d+)?(?:e[+-]?\d+)?(?=[,\]}])/gi)];
        const chosen = numbers.length ? [...new Set(infinities.map((k) => k % numbers.length))].sort((a, b) => b - a) : [];
        for (const k of chosen) {
          const m = numbers[k]!; // from the end, so earlier positions stay put
          text = text.slice(0, m.index) + '1e999' + text.slice(m.index + m[0].length);
        }
        const payload = Buffer.from(text);
        const parsedBack = (JSON.parse(text) as { records: unknown[] }).records;
        const result = checkAccounting(stream, payload, records.length);
        // Exactly the records the schema accepts (and not in the future) are kept.
        const latest = now.getTime() + MAX_FUTURE_MS;
        const valid = parsedBack.filter((r) => {
          const p = recordSchemas[stream].safeParse(r);
          return p.success && Date.parse(p.data.t) <= latest;
        });
        expect(result.records).toHaveLength(valid.length);
      }),
      { numRuns: 1500 },
    );
  });
});
