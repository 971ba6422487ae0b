import type { RejectReason } from '../../lib/telemetry/parsePayload';
import { buildFuzzedCases } from './fuzzedCases';

/**
 * A corpus of bad (and borderline good) telemetry input, each case with the
 * quarantine rows and stored records the ingest worker must produce for it.
 * test/ingestCorpus.test.ts publishes every case through a real broker, each
 * case under a vessel of its own, and checks the outcome case by case.
 */

export interface ExpectedRejection {
  reason: RejectReason;
  /** Quarantine rows with this reason (and detail), in this position; 1 when unset. */
  count?: number;
  /** The exact `detail`, or a pattern for texts that are not ours (JSON.parse messages). */
  detail?: string | RegExp;
}

export interface CorpusCase {
  name: string;
  /** What follows `{root}/{vessel}/` in the topic: usually the stream, or a spoofed rest of the path. */
  topicSuffix: string;
  /** The whole topic instead, for spoofs of the root or vessel level (`vessel` is the case's registered key). */
  topic?: (root: string, vessel: string) => string;
  /**
   * Whether the worker's subscription `{root}/+/+` receives the topic: yes
   * when unset; false when it never can, or MQTT forbids publishing it
   * (wildcards); 'mosquitto' for a topic with an empty level, which
   * Mosquitto's `+` matches (as MQTT says) and the embedded aedes broker's
   * does not. What the broker does not deliver, the test hands to the
   * worker's message handler directly.
   */
  delivered?: false | 'mosquitto';
  payload: string | Buffer;
  /** Quarantine rows of the message, in order (record order within a batch). */
  expect: ExpectedRejection[];
  /** Good records of the message that must be stored (each at its own `t`); 0 when unset. */
  good?: number;
}

// ---------------------------------------------------------------------------
// Building blocks

export type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
export type Obj = { [key: string]: Json };

/** Stand-ins for what JSON.stringify cannot write; `text` turns them into raw JSON. */
export const INF = '@@1e999@@';
export const NEG_INF = '@@-1e999@@';
export const NAN_TOKEN = '@@NaN@@';
export const INFINITY_TOKEN = '@@Infinity@@';

export function text(value: Json): string {
  return JSON.stringify(value)
    .replaceAll(`"${INF}"`, '1e999')
    .replaceAll(`"${NEG_INF}"`, '-1e999')
    .replaceAll(`"${NAN_TOKEN}"`, 'NaN')
    .replaceAll(`"${INFINITY_TOKEN}"`, 'Infinity');
}

/** A copy of `record` with `path` (dots; numbers index arrays) set to `value`, or removed when `value` is undefined. */
export function set(record: Obj, path: string, value: Json | undefined): Obj {
  const copy = structuredClone(record);
  const keys = path.split('.');
  let target: Record<string, Json> = copy;
  for (const key of keys.slice(0, -1)) target = target[key] as Record<string, Json>;
  const last = keys.at(-1)!;
  if (value === undefined) delete target[last];
  else target[last] = value;
  return copy;
}

export const BASE = Date.UTC(2026, 10, 15);
/** Interval start `k` minutes after the corpus base time, e.g. 2026-11-15T00:03:00Z. */
export const at = (k: number) => new Date(BASE + k * 60_000).toISOString().replace('.000Z', 'Z');

export const station = (t: string): Obj => ({
  v: 1,
  t,
  dt: 60,
  mode: 'auto_position',
  dp_s: 60,
  n: 3,
  sp: { lat: 59.1, lon: 2.5, hdg: 90 },
  err: { north_mean: 0.1, east_mean: -0.1, r_mean: 0.2, r_rms: 0.25, r_max: 0.4, hist: [1, 2] },
  hdg_err: { mean: 0.1, rms: 0.2, max_abs: 0.5 },
  env: { wind_ms: 8, wind_gust_ms: 11, wind_from_deg: 270, current_ms: 0.3, current_to_deg: 45, residual_kn: 12, residual_to_deg: 10 },
});

export const bands = [0, 0, 10, 20, 20, 10, 0, 0, 0, 0, 0]; // 60 s
export const thrusters = (t: string): Obj => ({
  v: 1,
  t,
  dt: 60,
  units: [
    { id: 'T1', run_s: 60, starts: 0, rpm: 180, pitch_pct: 40, load_pct_mean: 35, load_pct_max: 50, thrust_kn: 80, power_kw: 300, load_band_s: bands },
    { id: 'T2', run_s: 60, starts: 1, rpm: 300, load_pct_mean: 30, load_pct_max: 45, thrust_kn: 120, power_kw: 450, azimuth_deg: 135, azimuth_travel_deg: 20, load_band_s: bands },
  ],
});

export const power = (t: string): Obj => ({
  v: 1,
  t,
  dt: 60,
  buses: [
    { id: 'A', kw_mean: 900, kw_max: 1100, kw_available: 3000, gens_online: 2, limit_s: 0, limit_events: 0, blackout: false },
    { id: 'B', kw_mean: 800, kw_max: 950, kw_available: 3000, gens_online: 2, limit_s: 0, limit_events: 0, blackout: false },
  ],
});

export const refs = (t: string): Obj => ({
  v: 1,
  t,
  dt: 60,
  systems: [
    { id: 'GNSS1', kind: 'gnss', online_s: 60, weight: 0.6, sd_m: 0.3, rejected: 0 },
    { id: 'HPR1', kind: 'hydroacoustic', online_s: 60, weight: 0.4, sd_m: 0.8, rejected: 1 },
  ],
});

export const track = (t: string): Obj => ({ v: 1, t, lat: 59.1, lon: 2.5, hdg: 90, sp_lat: 59.1, sp_lon: 2.5, sp_hdg: 90 });

const good = station(at(0));
export const MiB = 1024 * 1024;
/** `json` padded with trailing spaces (valid JSON whitespace) to exactly `bytes` bytes. */
const padTo = (json: string, bytes: number) => json + ' '.repeat(bytes - Buffer.byteLength(json));
export const deep = (depth: number) => '['.repeat(depth) + ']'.repeat(depth);
/** A station record whose field `key` holds a raw JSON text. */
const stationWithRaw = (record: Obj, key: string, raw: string) => text({ ...record, [key]: '@@RAW@@' }).replace('"@@RAW@@"', raw);

const invalid = (detail?: string | RegExp): ExpectedRejection => ({ reason: 'invalid_record', detail });
export const JSON_ERROR = /JSON|Unexpected|Unterminated|Expected/;

// ---------------------------------------------------------------------------

/** The corpus; `now` is the shore clock the future-timestamp cases are relative to. */
export function buildBadInputCorpus(now: Date): CorpusCase[] {
  const ahead = (ms: number) => new Date(now.getTime() + ms).toISOString();
  const single = (name: string, topicSuffix: string, record: Json, expect: ExpectedRejection[], goodRecords = 0): CorpusCase => ({
    name,
    topicSuffix,
    payload: text(record),
    expect,
    good: goodRecords,
  });

  return [
    // --- Not JSON --------------------------------------------------------
    { name: 'malformed JSON: truncated record', topicSuffix: 'station', payload: text(good).slice(0, 40), expect: [{ reason: 'invalid_json', detail: JSON_ERROR }] },
    { name: 'malformed JSON: trailing comma', topicSuffix: 'station', payload: text(good).replace(/}$/, ',}'), expect: [{ reason: 'invalid_json', detail: JSON_ERROR }] },
    { name: 'malformed JSON: single quotes', topicSuffix: 'station', payload: text(good).replaceAll('"', "'"), expect: [{ reason: 'invalid_json', detail: JSON_ERROR }] },
    {
      name: 'truncated batch (link dropped mid-message)',
      topicSuffix: 'station',
      payload: text({ records: [station(at(0)), station(at(1))] }).slice(0, 500),
      expect: [{ reason: 'invalid_json', detail: JSON_ERROR }],
    },
    { name: 'empty payload', topicSuffix: 'station', payload: '', expect: [{ reason: 'invalid_json', detail: 'Unexpected end of JSON input' }] },
    { name: 'whitespace only', topicSuffix: 'station', payload: ' \n\t ', expect: [{ reason: 'invalid_json', detail: 'Unexpected end of JSON input' }] },
    { name: 'literal NaN is not JSON', topicSuffix: 'station', payload: text(set(good, 'dp_s', NAN_TOKEN)), expect: [{ reason: 'invalid_json', detail: JSON_ERROR }] },
    { name: 'literal Infinity is not JSON', topicSuffix: 'station', payload: text(set(good, 'dp_s', INFINITY_TOKEN)), expect: [{ reason: 'invalid_json', detail: JSON_ERROR }] },
    {
      name: 'invalid UTF-8 inside an otherwise valid record',
      topicSuffix: 'station',
      payload: Buffer.concat([Buffer.from(text(good).slice(0, -1) + ',"note":"'), Buffer.from([0xc3, 0x28, 0xff]), Buffer.from('"}')]),
      expect: [{ reason: 'invalid_json', detail: 'payload is not valid UTF-8' }],
    },
    {
      name: 'UTF-8 byte order mark before the record',
      topicSuffix: 'station',
      payload: Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(text(good))]),
      expect: [{ reason: 'invalid_json', detail: JSON_ERROR }],
    },
    {
      name: 'NUL bytes in the payload (quarantined, not a database error)',
      topicSuffix: 'station',
      payload: Buffer.from(`{"v":1,\u0000"t":"${at(0)}"}\u0000`),
      expect: [{ reason: 'invalid_json', detail: JSON_ERROR }],
    },

    // --- JSON, but not a record or a batch -------------------------------
    ...(
      [
        ['array of records', text([good])],
        ['number', '42'],
        ['string', '"station"'],
        ['null', 'null'],
        ['boolean', 'true'],
      ] as const
    ).map(([what, payload]): CorpusCase => ({
      name: `JSON ${what} instead of a record`,
      topicSuffix: 'station',
      payload,
      expect: [{ reason: 'invalid_payload', detail: 'payload must be a record object or {"records": [...]}' }],
    })),
    ...(
      [
        ['an object', { 0: good }],
        ['null', null],
        ['a string', '[]'],
        ['a record', good],
      ] as const
    ).map(([what, records]): CorpusCase => ({
      name: `"records" is ${what}, not an array`,
      topicSuffix: 'station',
      payload: text({ records } as Obj),
      expect: [{ reason: 'invalid_payload', detail: '"records" must be an array' }],
    })),
    { name: 'empty records batch: nothing stored, nothing quarantined', topicSuffix: 'station', payload: '{"records":[]}', expect: [] },

    // --- Limits ----------------------------------------------------------
    {
      name: '10,001 records in one batch',
      topicSuffix: 'track',
      payload: text({ records: Array.from({ length: 10_001 }, () => ({})) }),
      expect: [{ reason: 'too_many_records', detail: '10001 records; the limit is 10000 per message' }],
    },
    {
      name: 'exactly 10,000 records in one batch (accepted)',
      topicSuffix: 'track',
      payload: text({
        records: Array.from({ length: 10_000 }, (_, i) => ({
          v: 1,
          t: new Date(BASE + i * 1000).toISOString().replace('.000Z', 'Z'),
          lat: 59.1,
          lon: 2.5,
        })),
      }),
      expect: [],
      good: 10_000,
    },
    {
      name: 'payload of 1 MiB + 1 byte',
      topicSuffix: 'station',
      payload: padTo(text(good), MiB + 1),
      expect: [{ reason: 'payload_too_large', detail: `payload is ${MiB + 1} bytes; the limit is ${MiB}` }],
    },
    { name: 'payload of exactly 1 MiB (accepted)', topicSuffix: 'station', payload: padTo(text(good), MiB), expect: [], good: 1 },

    // --- v, t, dt ----------------------------------------------------------
    single('wrong version v: 2', 'station', set(good, 'v', 2), [invalid('record.v: Invalid input: expected 1')]),
    single('version as a string "1"', 'station', set(good, 'v', '1'), [invalid('record.v: Invalid input: expected 1')]),
    single('version missing', 'station', set(good, 'v', undefined), [invalid('record.v: Invalid input: expected 1')]),
    single('t missing', 'station', set(good, 't', undefined), [invalid('record.t: Invalid input: expected string, received undefined')]),
    ...(
      [
        ['without Z', '2026-11-15T00:00:00'],
        ['with an offset instead of Z', '2026-11-15T00:00:00+00:00'],
        ['with a lower-case z', '2026-11-15T00:00:00z'],
        ['with 4 fractional digits', '2026-11-15T00:00:00.1234Z'],
        ['as a date only', '2026-11-15'],
        ['with a space instead of T', '2026-11-15 00:00:00Z'],
      ] as const
    ).map(([what, t]) =>
      single(`t ${what}`, 'station', set(good, 't', t), [invalid('record.t: must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z')]),
    ),
    ...(
      [
        ['2026-02-30 (no such day)', '2026-02-30T00:00:00Z'],
        ['2026-11-31 (no such day)', '2026-11-31T00:00:00Z'],
        ['month 13', '2026-13-01T00:00:00Z'],
        ['hour 24', '2026-11-15T24:00:00Z'],
        ['a leap second 23:59:60', '2026-12-31T23:59:60Z'],
        ['year 0000', '0000-01-01T00:00:00Z'],
      ] as const
    ).map(([what, t]) => single(`t ${what}`, 'station', set(good, 't', t), [invalid('record.t: is not a real date and time')])),
    single('t as epoch milliseconds', 'station', set(good, 't', BASE), [invalid('record.t: Invalid input: expected string, received number')]),
    single('dt 0', 'station', set(good, 'dt', 0), [invalid('record.dt: Too small: expected number to be >=1')]),
    single('dt 3601', 'station', set(good, 'dt', 3601), [invalid('record.dt: Too big: expected number to be <=3600')]),
    single('dt 1.5', 'station', set(good, 'dt', 1.5), [invalid('record.dt: Invalid input: expected int, received number')]),
    single('dt as a string', 'station', set(good, 'dt', '60'), [invalid('record.dt: Invalid input: expected number, received string')]),
    single('dt missing', 'thrusters', set(thrusters(at(0)), 'dt', undefined), [invalid('record.dt: Invalid input: expected number, received undefined')]),

    // --- station ranges and types ----------------------------------------
    single('dp_s greater than dt', 'station', set(good, 'dp_s', 61), [invalid('record: dp_s must be ≤ dt (60)')]),
    single('negative dp_s', 'station', set(good, 'dp_s', -1), [invalid('record.dp_s: Too small: expected number to be >=0')]),
    single('negative n', 'station', set(set(good, 'n', -1), 'err.hist', undefined), [invalid('record.n: Too small: expected number to be >=0')]),
    single('fractional n', 'station', set(set(good, 'n', 2.5), 'err.hist', undefined), [invalid('record.n: Invalid input: expected int, received number')]),
    single('n beyond a 32-bit integer', 'station', set(set(good, 'n', 3e9), 'err.hist', undefined), [invalid('record.n: Too big: expected number to be <=2147483647')]),
    single('unknown DP mode', 'station', set(good, 'mode', 'auto'), [
      invalid('record.mode: Invalid option: expected one of "auto_position"|"auto_track"|"joystick"|"manual"|"standby"'),
    ]),
    single('mode missing', 'station', set(good, 'mode', undefined), [
      invalid('record.mode: Invalid option: expected one of "auto_position"|"auto_track"|"joystick"|"manual"|"standby"'),
    ]),
    single('set point lat 91', 'station', set(good, 'sp.lat', 91), [invalid('record.sp.lat: Too big: expected number to be <=90')]),
    single('set point lon -181', 'station', set(good, 'sp.lon', -181), [invalid('record.sp.lon: Too small: expected number to be >=-180')]),
    single('set point heading 361', 'station', set(good, 'sp.hdg', 361), [invalid('record.sp.hdg: Too big: expected number to be <=360')]),
    single('negative r_rms', 'station', set(good, 'err.r_rms', -0.1), [invalid('record.err.r_rms: Too small: expected number to be >=0')]),
    single('heading error mean 200', 'station', set(good, 'hdg_err.mean', 200), [invalid('record.hdg_err.mean: Too big: expected number to be <=180')]),
    single('wind from 361°', 'station', set(good, 'env.wind_from_deg', 361), [invalid('record.env.wind_from_deg: Too big: expected number to be <=360')]),
    single('negative wind speed', 'station', set(good, 'env.wind_ms', -1), [invalid('record.env.wind_ms: Too small: expected number to be >=0')]),
    single('dp_s as a string', 'station', set(good, 'dp_s', '60'), [invalid('record.dp_s: Invalid input: expected number, received string')]),
    single('n as a boolean', 'station', set(good, 'n', true), [invalid('record.n: Invalid input: expected number, received boolean')]),
    single('sp as a string', 'station', set(good, 'sp', '59.1,2.5'), [invalid('record.sp: Invalid input: expected object, received string')]),
    single('histogram not adding up to n', 'station', set(good, 'err.hist', [1, 1]), [invalid('record.err.hist: counts must add up to n (3)')]),
    single('histogram with 102 bins', 'station', set(good, 'err.hist', [3, ...Array(101).fill(0)]), [
      invalid('record.err.hist: Too big: expected array to have <=101 items'),
    ]),
    single('histogram with 101 bins (accepted)', 'station', set(good, 'err.hist', [...Array(100).fill(0), 3]), [], 1),
    single('negative histogram count', 'station', set(good, 'err.hist', [4, -1]), [invalid('record.err.hist.1: Too small: expected number to be >=0')]),
    single('fractional histogram count', 'station', set(good, 'err.hist', [1.5, 1.5]), [invalid('record.err.hist.0: Invalid input: expected int, received number')]),
    single('histogram as a string', 'station', set(good, 'err.hist', '1,2'), [invalid('record.err.hist: Invalid input: expected array, received string')]),
    single('error mean beyond a 32-bit float', 'station', set(good, 'err.north_mean', 1e39), [
      invalid('record.err.north_mean: Too big: expected number to be <=3.4e+38'),
    ]),
    single('error mean too close to 0 for a 32-bit float', 'station', set(good, 'err.north_mean', 1e-50), [
      invalid('record.err.north_mean: is too close to 0 for a 32-bit float'),
    ]),
    single('tiny but representable error mean (accepted)', 'station', set(good, 'err.north_mean', 1e-40), [], 1),

    // --- not finite --------------------------------------------------------
    {
      name: '1e999 (Infinity after JSON.parse) for dp_s',
      topicSuffix: 'station',
      payload: text(set(good, 'dp_s', INF)),
      expect: [{ reason: 'non_finite_number', detail: 'record.dp_s: Invalid input: expected number, received Infinity' }],
    },
    {
      name: '-1e999 in err.north_mean',
      topicSuffix: 'station',
      payload: text(set(good, 'err.north_mean', NEG_INF)),
      expect: [{ reason: 'non_finite_number', detail: 'record.err.north_mean: Invalid input: expected number, received -Infinity' }],
    },
    {
      name: '1e999 inside the histogram',
      topicSuffix: 'station',
      payload: text(set(good, 'err.hist', [1, INF])),
      expect: [{ reason: 'non_finite_number', detail: 'record.err.hist.1: Invalid input: expected number, received Infinity' }],
    },
    {
      name: '1e999 for v',
      topicSuffix: 'station',
      payload: text(set(good, 'v', INF)),
      expect: [{ reason: 'non_finite_number', detail: 'record.v: Invalid input: expected 1' }],
    },
    {
      name: '1e999 for a thruster rpm, beside another bad field',
      topicSuffix: 'thrusters',
      payload: text(set(set(thrusters(at(0)), 'units.1.rpm', INF), 'units.0.starts', -1)),
      expect: [{ reason: 'non_finite_number', detail: 'record.units.1.rpm: Invalid input: expected number, received Infinity' }],
    },
    single('1e999 in an unknown field (ignored, accepted)', 'station', { ...good, spare: INF }, [], 1),

    // --- timestamps relative to the shore clock ----------------------------
    single('t 6 minutes in the future', 'station', set(good, 't', ahead(6 * 60_000)), [{ reason: 'future_timestamp' }]),
    single('t 4 minutes in the future (accepted)', 'station', set(good, 't', ahead(4 * 60_000)), [], 1),
    single('t in the year 1990 (accepted, stored)', 'station', set(good, 't', '1990-06-15T12:00:00Z'), [], 1),

    // --- thrusters -----------------------------------------------------------
    single('pitch 120 %', 'thrusters', set(thrusters(at(0)), 'units.0.pitch_pct', 120), [invalid('record.units.0.pitch_pct: Too big: expected number to be <=100')]),
    single('run_s greater than dt', 'thrusters', set(set(thrusters(at(0)), 'units.1.run_s', 61), 'units.1.load_band_s', undefined), [
      invalid('record: run_s must be ≤ dt (60)'),
    ]),
    single('negative starts', 'thrusters', set(thrusters(at(0)), 'units.0.starts', -1), [invalid('record.units.0.starts: Too small: expected number to be >=0')]),
    single('azimuth 361°', 'thrusters', set(thrusters(at(0)), 'units.1.azimuth_deg', 361), [invalid('record.units.1.azimuth_deg: Too big: expected number to be <=360')]),
    single('negative power', 'thrusters', set(thrusters(at(0)), 'units.0.power_kw', -5), [invalid('record.units.0.power_kw: Too small: expected number to be >=0')]),
    single('duplicate thruster ids in one record', 'thrusters', set(thrusters(at(0)), 'units.1.id', 'T1'), [invalid('record.units: duplicate thruster id T1')]),
    single('empty units array', 'thrusters', set(thrusters(at(0)), 'units', []), [invalid('record.units: Too small: expected array to have >=1 items')]),
    single('units missing', 'thrusters', set(thrusters(at(0)), 'units', undefined), [invalid('record.units: Invalid input: expected array, received undefined')]),
    single('thruster id with a space', 'thrusters', set(thrusters(at(0)), 'units.0.id', 'T 1'), [invalid('record.units.0.id: must match ^[A-Za-z0-9_-]{1,16}$')]),
    single('thruster id of 17 characters', 'thrusters', set(thrusters(at(0)), 'units.0.id', 'T'.repeat(17)), [invalid('record.units.0.id: must match ^[A-Za-z0-9_-]{1,16}$')]),
    single('load bands with 10 entries', 'thrusters', set(thrusters(at(0)), 'units.0.load_band_s', bands.slice(1)), [
      invalid('record.units.0.load_band_s: Too small: expected array to have exactly 11 items'),
    ]),
    single('load bands with 12 entries', 'thrusters', set(thrusters(at(0)), 'units.0.load_band_s', [...bands, 0]), [
      invalid('record.units.0.load_band_s: Too big: expected array to have exactly 11 items'),
    ]),
    single('load bands 1.5 s short of run_s', 'thrusters', set(thrusters(at(0)), 'units.0.load_band_s', [0, 0, 10, 20, 20, 8.5, 0, 0, 0, 0, 0]), [
      invalid('record.units.0.load_band_s: must add up to run_s (60), got 58.5'),
    ]),
    single('load bands 0.5 s over run_s (inside the 1 s tolerance, accepted)', 'thrusters', set(thrusters(at(0)), 'units.0.load_band_s', [0, 0, 10, 20, 20, 10.5, 0, 0, 0, 0, 0]), [], 1),
    single('load bands exactly 1 s short of run_s (the tolerance is inclusive, accepted)', 'thrusters', set(thrusters(at(0)), 'units.0.load_band_s', [0, 0, 10, 20, 20, 9, 0, 0, 0, 0, 0]), [], 1),
    single('negative load band', 'thrusters', set(thrusters(at(0)), 'units.0.load_band_s', [-10, 0, 20, 20, 20, 10, 0, 0, 0, 0, 0]), [
      invalid('record.units.0.load_band_s.0: Too small: expected number to be >=0'),
    ]),
    single('only id, run_s and starts (accepted, the rest stored as NULL)', 'thrusters', { v: 1, t: at(0), dt: 60, units: [{ id: 'T1', run_s: 0, starts: 0 }] }, [], 1),

    // --- power ---------------------------------------------------------------
    single('duplicate bus ids', 'power', set(power(at(0)), 'buses.1.id', 'A'), [invalid('record.buses: duplicate bus id A')]),
    single('empty buses array', 'power', set(power(at(0)), 'buses', []), [invalid('record.buses: Too small: expected array to have >=1 items')]),
    single('limit_s greater than dt', 'power', set(power(at(0)), 'buses.0.limit_s', 90), [invalid('record: limit_s must be ≤ dt (60)')]),
    single('blackout as a string', 'power', set(power(at(0)), 'buses.0.blackout', 'false'), [invalid('record.buses.0.blackout: Invalid input: expected boolean, received string')]),
    single('1.5 generators online', 'power', set(power(at(0)), 'buses.1.gens_online', 1.5), [invalid('record.buses.1.gens_online: Invalid input: expected int, received number')]),
    single('negative consumed power', 'power', set(power(at(0)), 'buses.0.kw_mean', -1), [invalid('record.buses.0.kw_mean: Too small: expected number to be >=0')]),

    // --- refs ----------------------------------------------------------------
    single('reference weight 1.5', 'refs', set(refs(at(0)), 'systems.0.weight', 1.5), [invalid('record.systems.0.weight: Too big: expected number to be <=1')]),
    single('negative sd_m', 'refs', set(refs(at(0)), 'systems.1.sd_m', -0.2), [invalid('record.systems.1.sd_m: Too small: expected number to be >=0')]),
    single('unknown reference kind', 'refs', set(refs(at(0)), 'systems.0.kind', 'lidar'), [
      invalid('record.systems.0.kind: Invalid option: expected one of "gnss"|"hydroacoustic"|"laser"|"radar"|"taut_wire"|"other"'),
    ]),
    single('empty systems array', 'refs', set(refs(at(0)), 'systems', []), [invalid('record.systems: Too small: expected array to have >=1 items')]),
    single('online_s greater than dt', 'refs', set(refs(at(0)), 'systems.1.online_s', 61), [invalid('record: online_s must be ≤ dt (60)')]),
    single('duplicate reference system ids', 'refs', set(refs(at(0)), 'systems.1.id', 'GNSS1'), [invalid('record.systems: duplicate reference system id GNSS1')]),
    single('negative rejected count', 'refs', set(refs(at(0)), 'systems.0.rejected', -1), [invalid('record.systems.0.rejected: Too small: expected number to be >=0')]),

    // --- track ---------------------------------------------------------------
    single('track lat 91', 'track', set(track(at(0)), 'lat', 91), [invalid('record.lat: Too big: expected number to be <=90')]),
    single('track lon as a string', 'track', set(track(at(0)), 'lon', '2.5'), [invalid('record.lon: Invalid input: expected number, received string')]),
    single('track lon missing', 'track', set(track(at(0)), 'lon', undefined), [invalid('record.lon: Invalid input: expected number, received undefined')]),
    single('track heading 361', 'track', set(track(at(0)), 'hdg', 361), [invalid('record.hdg: Too big: expected number to be <=360')]),

    // --- extra and missing fields ------------------------------------------
    single(
      'unknown extra fields at every level (accepted, ignored)',
      'station',
      { ...good, vessel: 'someone-else', firmware: '2.3.1', err: { ...(good.err as Obj), p95: 0.35 }, env: { ...(good.env as Obj), wave_hs_m: 2.1 } },
      [],
      1,
    ),
    single('only the required station fields (accepted, the rest stored as NULL)', 'station', { v: 1, t: at(0), dt: 60, mode: 'standby', dp_s: 0, n: 0 }, [], 1),
    single('a failed wind sensor: env without wind fields (accepted)', 'station', set(set(set(good, 'env.wind_ms', undefined), 'env.wind_gust_ms', undefined), 'env.wind_from_deg', undefined), [], 1),

    // --- mixed batches: the good records stay ---------------------------------
    {
      name: 'station batch: good records beside bad ones',
      topicSuffix: 'station',
      payload: text({
        records: [
          station(at(0)),
          set(station(at(1)), 'dp_s', 75),
          station(at(2)),
          set(station(at(3)), 'err.hist', [3, 1]),
          set(station(at(4)), 't', ahead(3600_000)),
          set(station(at(5)), 'env.wind_ms', INF),
          station(at(6)),
          null,
          42,
        ],
      }),
      expect: [
        invalid('records[1]: dp_s must be ≤ dt (60)'),
        invalid('records[3].err.hist: counts must add up to n (3)'),
        { reason: 'future_timestamp', detail: new RegExp(`^records\\[4\\]\\.t: ${ahead(3600_000).slice(0, 13)}.* is more than 5 minutes ahead of the shore clock$`) },
        { reason: 'non_finite_number', detail: 'records[5].env.wind_ms: Invalid input: expected number, received Infinity' },
        invalid('records[7]: Invalid input: expected object, received null'),
        invalid('records[8]: Invalid input: expected object, received number'),
      ],
      good: 3,
    },
    {
      name: 'thrusters batch: good records beside bad ones',
      topicSuffix: 'thrusters',
      payload: text({
        records: [
          set(thrusters(at(0)), 'units.1.id', 'T1'),
          thrusters(at(1)),
          set(thrusters(at(2)), 'units.0.load_band_s', [60, 10, 0, 0, 0, 0, 0, 0, 0, 0, 0]),
          thrusters(at(3)),
          set(thrusters(at(4)), 'units', []),
        ],
      }),
      expect: [
        invalid('records[0].units: duplicate thruster id T1'),
        invalid('records[2].units.0.load_band_s: must add up to run_s (60), got 70'),
        invalid('records[4].units: Too small: expected array to have >=1 items'),
      ],
      good: 2,
    },
    {
      name: 'power batch: good records beside bad ones',
      topicSuffix: 'power',
      payload: text({ records: [power(at(0)), set(power(at(1)), 'buses.0.blackout', 1), power(at(2))] }),
      expect: [invalid('records[1].buses.0.blackout: Invalid input: expected boolean, received number')],
      good: 2,
    },
    {
      name: 'refs batch: good records beside bad ones',
      topicSuffix: 'refs',
      payload: text({ records: [set(refs(at(0)), 'systems.0.weight', -0.1), refs(at(1)), set(refs(at(2)), 'v', 2)] }),
      expect: [invalid('records[0].systems.0.weight: Too small: expected number to be >=0'), invalid('records[2].v: Invalid input: expected 1')],
      good: 1,
    },
    {
      name: 'track batch: good positions beside bad ones',
      topicSuffix: 'track',
      payload: text({
        records: [track(at(0)), set(track(at(1)), 'lat', -91), track(at(2)), set(track(at(3)), 't', '2026-11-15T00:03:00+01:00'), 'position', track(at(5))],
      }),
      expect: [
        invalid('records[1].lat: Too small: expected number to be >=-90'),
        invalid('records[3].t: must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z'),
        invalid('records[4]: Invalid input: expected object, received string'),
      ],
      good: 3,
    },
    {
      name: 'batch of one bad record names its index',
      topicSuffix: 'station',
      payload: text({ records: [set(good, 'mode', 'dp')] }),
      expect: [invalid('records[0].mode: Invalid option: expected one of "auto_position"|"auto_track"|"joystick"|"manual"|"standby"')],
    },

    // --- topics ------------------------------------------------------------------
    {
      name: 'unregistered vessel',
      topicSuffix: 'station',
      topic: (root, vessel) => `${root}/${vessel}-ghost/station`,
      payload: text(good),
      expect: [{ reason: 'unknown_vessel', detail: /^vessel ".*-ghost" is not registered$/ }],
    },
    {
      name: 'unregistered vessel with a malformed payload (identity is checked first)',
      topicSuffix: 'station',
      topic: (root, vessel) => `${root}/${vessel}-ghost/station`,
      payload: '{ nope',
      expect: [{ reason: 'unknown_vessel', detail: /^vessel ".*-ghost" is not registered$/ }],
    },
    { name: 'unknown stream "weather"', topicSuffix: 'weather', payload: text(good), expect: [{ reason: 'unknown_stream', detail: 'unknown stream "weather"' }] },
    { name: 'stream in upper case', topicSuffix: 'Station', payload: text(good), expect: [{ reason: 'unknown_stream', detail: 'unknown stream "Station"' }] },
    { name: 'empty stream level', topicSuffix: '', delivered: 'mosquitto', payload: text(good), expect: [{ reason: 'unknown_stream', detail: 'unknown stream ""' }] },
    ...(
      [
        ['vessel key in upper case', (root: string, vessel: string) => `${root}/${vessel.toUpperCase()}/station`],
        ['vessel key with a dot', (root: string, vessel: string) => `${root}/${vessel}.x/station`],
        ['vessel key of 33 characters', (root: string, vessel: string) => `${root}/${vessel.padEnd(33, 'x')}/station`],
        ['vessel key starting with a hyphen', (root: string, vessel: string) => `${root}/-${vessel}/station`],
      ] as const
    ).map(
      ([what, topic]): CorpusCase => ({
        name: `bad topic: ${what}`,
        topicSuffix: 'station',
        topic,
        payload: text(good),
        expect: [{ reason: 'bad_topic', detail: /^topic is not .*\/\{vessel\}\/\{stream\}$/ }],
      }),
    ),
    {
      name: 'bad topic: empty vessel level',
      topicSuffix: 'station',
      topic: (root) => `${root}//station`,
      delivered: 'mosquitto',
      payload: text(good),
      expect: [{ reason: 'bad_topic', detail: /^topic is not .*\/\{vessel\}\/\{stream\}$/ }],
    },
    ...(
      [
        ['an extra level', (root: string, vessel: string) => `${root}/${vessel}/station/extra`],
        ['a missing stream level', (root: string, vessel: string) => `${root}/${vessel}`],
        ['a different root', (root: string, vessel: string) => `${root.replace(/\/v1$/, '/v2')}/${vessel}/station`],
        ['the root in upper case', (root: string, vessel: string) => `${root.toUpperCase()}/${vessel}/station`],
        ['a + wildcard in the vessel level', (root: string, vessel: string) => `${root}/${vessel}+/station`],
        ['a # wildcard after the stream', (root: string, vessel: string) => `${root}/${vessel}/station/#`],
      ] as const
    ).map(
      ([what, topic]): CorpusCase => ({
        name: `spoofed topic with ${what} (never delivered by the subscription; handled directly)`,
        topicSuffix: 'station',
        topic,
        delivered: false,
        payload: text(good),
        expect: [{ reason: 'bad_topic', detail: /^topic is not .*\/\{vessel\}\/\{stream\}$/ }],
      }),
    ),
    {
      name: 'a # wildcard as the stream (handled directly)',
      topicSuffix: '#',
      delivered: false,
      payload: text(good),
      expect: [{ reason: 'unknown_stream', detail: 'unknown stream "#"' }],
    },

    // --- deep nesting and huge arrays -------------------------------------------
    { name: '10,000 levels of [ (truncated)', topicSuffix: 'station', payload: '['.repeat(10_000), expect: [{ reason: 'invalid_json', detail: 'Unexpected end of JSON input' }] },
    {
      name: '10,000 levels of nested arrays (complete)',
      topicSuffix: 'station',
      payload: deep(10_000),
      expect: [{ reason: 'invalid_payload', detail: 'payload must be a record object or {"records": [...]}' }],
    },
    {
      name: '500,000 levels of nested arrays (complete, just under 1 MiB)',
      topicSuffix: 'station',
      payload: deep(500_000),
      expect: [{ reason: 'invalid_payload', detail: 'payload must be a record object or {"records": [...]}' }],
    },
    {
      name: '100,000 levels of nested objects',
      topicSuffix: 'station',
      payload: '{"a":'.repeat(100_000) + '1' + '}'.repeat(100_000),
      expect: [invalid('record.v: Invalid input: expected 1')],
    },
    {
      name: 'deeply nested arrays in a contract field',
      topicSuffix: 'station',
      payload: stationWithRaw(good, 'err', deep(100_000)),
      expect: [invalid('record.err: Invalid input: expected object, received array')],
    },
    {
      name: 'deeply nested arrays in an unknown field of a bad record (too deep to print back)',
      topicSuffix: 'station',
      payload: stationWithRaw(set(good, 'dp_s', 99), 'extra', deep(100_000)),
      expect: [invalid('record: dp_s must be ≤ dt (60)')],
    },
    { name: 'deeply nested arrays in an unknown field of a good record (accepted)', topicSuffix: 'station', payload: stationWithRaw(good, 'extra', deep(100_000)), expect: [], good: 1 },
    single('histogram of 100,000 bins', 'station', set(good, 'err.hist', [3, ...Array(99_999).fill(0)]), [
      invalid('record.err.hist: Too big: expected array to have <=101 items'),
    ]),
    single('20,000 copies of one thruster unit', 'thrusters', set(thrusters(at(0)), 'units', Array(20_000).fill({ id: 'T1', run_s: 0, starts: 0 })), [
      invalid('record.units: duplicate thruster id T1'),
    ]),
    single('an unknown field holding 200,000 numbers (accepted, ignored)', 'station', { ...good, samples: Array(200_000).fill(0.5) }, [], 1),

    // --- generated by fast-check from fixed seeds (test/corpus/fuzzedCases.ts) ---------
    ...buildFuzzedCases(now),
  ];
}
