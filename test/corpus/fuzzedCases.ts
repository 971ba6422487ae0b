import fc from 'fast-check';
import { MAX_PAYLOAD_BYTES, MAX_RECORDS_PER_MESSAGE } from '../../lib/telemetry/parsePayload';
import { STREAMS } from '../../lib/telemetry/schemas';
import {
  at,
  INF,
  INFINITY_TOKEN,
  JSON_ERROR,
  NAN_TOKEN,
  NEG_INF,
  power,
  refs,
  set,
  station,
  text,
  thrusters,
  track,
  type CorpusCase,
  type ExpectedRejection,
  type Json,
  type Obj,
} from './badInput';

/**
 * Property-based cases for the bad-input corpus: fast-check draws each
 * family's inputs from a fixed seed (so the corpus, and its test names, are
 * the same on every run), and each case is built so that its outcome follows
 * from how it was made — a prefix of a record is never JSON, a count one
 * more than the histogram's sum never adds up — never from running the
 * parser. Only functions here: badInput.ts imports this file and this file
 * its building blocks.
 */

const SEED = 20261202;
/** Cases drawn per family: 15 families, about 90 cases. */
const PER_FAMILY = 6;

const draw = <T>(arbitrary: fc.Arbitrary<T>, salt: number, runs = PER_FAMILY): T[] => fc.sample(arbitrary, { seed: SEED + salt, numRuns: runs });

const invalid = (detail: string | RegExp): ExpectedRejection => ({ reason: 'invalid_record', detail });
const escape = (s: string) => s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');

/** A good record of each stream, at minute `k` of the corpus day. */
const goodRecord: Record<(typeof STREAMS)[number], (k: number) => Obj> = {
  station: (k) => station(at(k)),
  thrusters: (k) => thrusters(at(k)),
  power: (k) => power(at(k)),
  refs: (k) => refs(at(k)),
  track: (k) => track(at(k)),
};

/** Numeric fields of the contract, with their limits where the contract has them (paths as `set` takes them). */
const NUMERIC_FIELDS: { stream: (typeof STREAMS)[number]; path: string; min?: number; max?: number }[] = [
  { stream: 'station', path: 'dp_s', min: 0 },
  { stream: 'station', path: 'sp.lat', min: -90, max: 90 },
  { stream: 'station', path: 'sp.lon', min: -180, max: 180 },
  { stream: 'station', path: 'sp.hdg', min: 0, max: 360 },
  { stream: 'station', path: 'err.r_rms', min: 0 },
  { stream: 'station', path: 'hdg_err.mean', min: -180, max: 180 },
  { stream: 'station', path: 'env.wind_from_deg', min: 0, max: 360 },
  { stream: 'station', path: 'env.current_ms', min: 0 },
  { stream: 'thrusters', path: 'units.0.pitch_pct', min: -100, max: 100 },
  { stream: 'thrusters', path: 'units.1.azimuth_deg', min: 0, max: 360 },
  { stream: 'thrusters', path: 'units.0.power_kw', min: 0 },
  { stream: 'power', path: 'buses.0.kw_mean', min: 0 },
  { stream: 'refs', path: 'systems.0.weight', min: 0, max: 1 },
  { stream: 'refs', path: 'systems.1.sd_m', min: 0 },
  { stream: 'track', path: 'lat', min: -90, max: 90 },
  { stream: 'track', path: 'lon', min: -180, max: 180 },
];

const field = fc.constantFrom(...NUMERIC_FIELDS);
const bounded = NUMERIC_FIELDS.filter((f) => f.max !== undefined);

/** What JSON.stringify writes for a value zod names by type. */
const NOT_A_NUMBER: [Json, string][] = [
  ['12', 'string'],
  [true, 'boolean'],
  [null, 'null'],
  [[1, 2], 'array'],
  [{ value: 1 }, 'object'],
];

export function buildFuzzedCases(now: Date): CorpusCase[] {
  const cases: CorpusCase[] = [];
  const add = (family: string, i: number, c: Omit<CorpusCase, 'name'>) => cases.push({ name: `fuzzed ${family} #${i + 1}`, ...c });
  const single = (stream: string, record: Json, expect: ExpectedRejection[], good = 0) => ({ topicSuffix: stream, payload: text(record), expect, good });

  // Truncated JSON: any proper prefix of a record or batch text lacks its closing brace.
  for (const [i, [stream, cut, batch]] of draw(fc.tuple(fc.constantFrom(...STREAMS), fc.double({ min: 0, max: 1, noNaN: true }), fc.boolean()), 1).entries()) {
    const whole = text(batch ? { records: [goodRecord[stream](0), goodRecord[stream](1)] } : goodRecord[stream](0));
    const length = 1 + Math.floor(cut * (whole.length - 2));
    add('truncated JSON', i, { topicSuffix: stream, payload: whole.slice(0, length), expect: [{ reason: 'invalid_json', detail: JSON_ERROR }] });
  }

  // Invalid UTF-8 at any position: a lone continuation byte, an overlong lead, or 0xFF.
  for (const [i, [stream, where, bad]] of draw(fc.tuple(fc.constantFrom(...STREAMS), fc.double({ min: 0, max: 1, noNaN: true }), fc.constantFrom(0x80, 0xc0, 0xff, 0xfe)), 2).entries()) {
    const bytes = Buffer.from(text(goodRecord[stream](0)));
    const k = Math.floor(where * bytes.length);
    add('invalid UTF-8', i, {
      topicSuffix: stream,
      payload: Buffer.concat([bytes.subarray(0, k), Buffer.from([bad]), bytes.subarray(k)]),
      expect: [{ reason: 'invalid_json', detail: 'payload is not valid UTF-8' }],
    });
  }

  // NaN and Infinity written as JavaScript would: not JSON at all.
  for (const [i, [f, token]] of draw(fc.tuple(field, fc.constantFrom(NAN_TOKEN, INFINITY_TOKEN)), 3).entries()) {
    add('NaN/Infinity literal', i, { ...single(f.stream, set(goodRecord[f.stream](0), f.path, token), []), expect: [{ reason: 'invalid_json', detail: JSON_ERROR }] });
  }

  // 1e999 (JSON that parses to ±Infinity) in a contract field: non_finite_number, naming the field.
  for (const [i, [f, token]] of draw(fc.tuple(field, fc.constantFrom(INF, NEG_INF)), 4).entries()) {
    add('1e999 in a contract field', i, single(f.stream, set(goodRecord[f.stream](0), f.path, token), [
      { reason: 'non_finite_number', detail: new RegExp(`^record\\.${escape(f.path)}: `) },
    ]));
  }

  // Wrong types in a numeric field.
  for (const [i, [f, [value, type]]] of draw(fc.tuple(field, fc.constantFrom(...NOT_A_NUMBER)), 5).entries()) {
    add('wrong type', i, single(f.stream, set(goodRecord[f.stream](0), f.path, value), [invalid(`record.${f.path}: Invalid input: expected number, received ${type}`)]));
  }

  // Out of range, just past a limit or far beyond it (staying inside a 32-bit float).
  for (const [i, [f, above, beyond]] of draw(fc.tuple(fc.constantFrom(...bounded), fc.boolean(), fc.double({ min: 0.001, max: 1e6, noNaN: true })), 6).entries()) {
    const value = above ? f.max! + beyond : f.min! - beyond;
    const detail = above ? `Too big: expected number to be <=${f.max}` : `Too small: expected number to be >=${f.min}`;
    add('out of range', i, single(f.stream, set(goodRecord[f.stream](0), f.path, value), [invalid(`record.${f.path}: ${detail}`)]));
  }

  // Histogram counts that do not add up to n.
  for (const [i, [hist, off]] of draw(fc.tuple(fc.array(fc.nat(50), { minLength: 1, maxLength: 101 }), fc.integer({ min: 1, max: 1000 })), 7).entries()) {
    const n = hist.reduce((a, b) => a + b, 0) + off;
    add('histogram not adding up', i, single('station', set(set(station(at(0)), 'n', n), 'err.hist', hist), [invalid(`record.err.hist: counts must add up to n (${n})`)]));
  }

  // Load bands missing run time by more than the 1 s tolerance (whole seconds, so the sum is exact).
  for (const [i, [runS, bands]] of draw(
    fc.tuple(fc.integer({ min: 0, max: 60 }), fc.array(fc.nat(12), { minLength: 11, maxLength: 11 })).filter(([r, b]) => Math.abs(b.reduce((x, y) => x + y, 0) - r) > 1),
    8,
  ).entries()) {
    const total = bands.reduce((a, b) => a + b, 0);
    const record = set(set(thrusters(at(0)), 'units.1.run_s', runS), 'units.1.load_band_s', bands);
    add('load bands not adding up', i, single('thrusters', record, [invalid(`record.units.1.load_band_s: must add up to run_s (${runS}), got ${total}`)]));
  }

  // Future timestamps, from just past the 5-minute allowance to centuries ahead.
  for (const [i, ahead] of draw(fc.integer({ min: 6 * 60, max: 200 * 365 * 86_400 }), 9).entries()) {
    const t = new Date(Math.floor(now.getTime() / 1000) * 1000 + ahead * 1000).toISOString().replace('.000Z', 'Z');
    add('future timestamp', i, single('station', set(station(at(0)), 't', t), [{ reason: 'future_timestamp', detail: `record.t: ${t} is more than 5 minutes ahead of the shore clock` }]));
  }

  // Ancient timestamps are valid and stored (their partitions are made on the spot).
  for (const [i, instant] of draw(fc.date({ min: new Date('1950-01-01T00:00:00Z'), max: new Date('2005-12-31T23:59:00Z'), noInvalidDate: true }), 10).entries()) {
    const t = new Date(Math.floor(instant.getTime() / 60_000) * 60_000).toISOString().replace('.000Z', 'Z');
    add('ancient timestamp (accepted)', i, single('track', set(track(at(0)), 't', t), [], 1));
  }

  // Unregistered vessels with well-formed keys.
  for (const [i, tail] of draw(fc.stringMatching(/^[a-z0-9]{1,6}$/), 11).entries()) {
    add('unknown vessel', i, {
      topicSuffix: 'station',
      topic: (root, vessel) => `${root}/${vessel}-x${tail}/station`,
      payload: text(station(at(0))),
      expect: [{ reason: 'unknown_vessel', detail: /^vessel ".*" is not registered$/ }],
    });
  }

  // Unknown streams: any other topic level.
  for (const [i, stream] of draw(fc.stringMatching(/^[a-z_]{1,12}$/).filter((s) => !(STREAMS as readonly string[]).includes(s)), 12).entries()) {
    add('unknown stream', i, { topicSuffix: `${stream}`, payload: text(station(at(0))), expect: [{ reason: 'unknown_stream', detail: `unknown stream "${stream}"` }] });
  }

  // Spoofed topics the subscription never delivers: extra levels or another root (handed to the worker directly).
  for (const [i, [extra, levels]] of draw(fc.tuple(fc.stringMatching(/^[a-z0-9]{1,8}$/), fc.integer({ min: 1, max: 3 })), 13).entries()) {
    add('spoofed topic', i, {
      topicSuffix: 'station',
      topic: i % 2 ? (root, vessel) => `${root}/${vessel}/station${`/${extra}`.repeat(levels)}` : (root, vessel) => `${extra}/${root}/${vessel}/station`,
      delivered: false,
      payload: text(station(at(0))),
      expect: [{ reason: 'bad_topic', detail: /^topic is not .*\/\{vessel\}\/\{stream\}$/ }],
    });
  }

  // Oversized payloads and batches over the record limit (few: each is large).
  for (const [i, over] of draw(fc.integer({ min: 1, max: MAX_PAYLOAD_BYTES / 2 }), 14, 3).entries()) {
    const bytes = MAX_PAYLOAD_BYTES + over;
    add('oversized payload', i, {
      topicSuffix: 'station',
      payload: text(station(at(0))).padEnd(bytes, ' '),
      expect: [{ reason: 'payload_too_large', detail: `payload is ${bytes} bytes; the limit is ${MAX_PAYLOAD_BYTES}` }],
    });
  }
  for (const [i, count] of draw(fc.integer({ min: MAX_RECORDS_PER_MESSAGE + 1, max: MAX_RECORDS_PER_MESSAGE + 2_000 }), 15, 3).entries()) {
    add('huge records array', i, {
      topicSuffix: 'track',
      payload: `{"records":[${Array(count).fill('0').join(',')}]}`,
      expect: [{ reason: 'too_many_records', detail: `${count} records; the limit is ${MAX_RECORDS_PER_MESSAGE} per message` }],
    });
  }

  // Deep nesting: objects around the record (not a record), or arrays in an unknown field (ignored).
  for (const [i, [depth, where]] of draw(fc.tuple(fc.integer({ min: 2, max: 50_000 }), fc.boolean()), 16).entries()) {
    if (where) {
      add('deeply nested', i, { topicSuffix: 'station', payload: '{"a":'.repeat(depth) + text(station(at(0))) + '}'.repeat(depth), expect: [invalid('record.v: Invalid input: expected 1')] });
    } else {
      const payload = text({ ...station(at(0)), spare: '@@RAW@@' }).replace('"@@RAW@@"', '['.repeat(depth) + ']'.repeat(depth));
      add('deeply nested', i, { topicSuffix: 'station', payload, expect: [], good: 1 });
    }
  }

  // Batches mixing good records with bad ones: every bad one quarantined with its index, every good one kept.
  for (const [i, [stream, kinds]] of draw(fc.tuple(fc.constantFrom(...STREAMS), fc.array(fc.constantFrom('good', 'string', 'null', 'no-v', 'future'), { minLength: 2, maxLength: 40 })), 17).entries()) {
    const records: Json[] = [];
    const expect: ExpectedRejection[] = [];
    let good = 0;
    const future = new Date(now.getTime() + 3600_000).toISOString();
    for (const [k, kind] of kinds.entries()) {
      const record = goodRecord[stream](k);
      if (kind === 'good') {
        records.push(record);
        good++;
      } else if (kind === 'string') {
        records.push('record');
        expect.push(invalid(`records[${k}]: Invalid input: expected object, received string`));
      } else if (kind === 'null') {
        records.push(null);
        expect.push(invalid(`records[${k}]: Invalid input: expected object, received null`));
      } else if (kind === 'no-v') {
        records.push(set(record, 'v', undefined));
        expect.push(invalid(`records[${k}].v: Invalid input: expected 1`));
      } else {
        records.push(set(record, 't', future));
        expect.push({ reason: 'future_timestamp', detail: `records[${k}].t: ${future} is more than 5 minutes ahead of the shore clock` });
      }
    }
    add('mixed batch', i, { topicSuffix: stream, payload: text({ records }), expect, good });
  }
  return cases;
}
