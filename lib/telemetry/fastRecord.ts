import {
  bandsMatchRunTime,
  FLOAT4_MAX,
  fitsFloat4,
  INT4_MAX,
  isRealTime,
  ISO_UTC,
  REF_KINDS,
  STATION_MODES,
  sum,
  UNIT_ID,
  type Stream,
  type TelemetryRecord,
} from './schemas';

/**
 * The common case of the contract checked by hand: the same rules as the zod
 * schemas in schemas.ts, without zod's per-field bookkeeping and copies (zod
 * and JSON.parse were a third of the ingest worker's CPU, zod about four
 * times JSON.parse's share; this takes about a third of it). A record that passes
 * comes back as it is, or as a copy without its unknown fields when it has
 * any — what zod would return. Anything else is `undefined`, and the caller
 * asks zod, which stays the authority for the reason of a rejection.
 * fastRecord.test.ts and test/ingestFastPath.test.ts prove both agree.
 *
 * Each shape is written out field by field: named property reads are what
 * make it fast (a table-driven version of the same checks took three times
 * as long). Written for JSON.parse output: plain objects and arrays, no
 * `undefined` values.
 */
export function fastRecord<S extends Stream>(stream: S, item: unknown): TelemetryRecord[S] | undefined {
  const out = checks[stream](item);
  return out === FAIL ? undefined : (out as TelemetryRecord[S]);
}

/** A value failed a check (a symbol, so no JSON value can be mistaken for it). */
const FAIL: unique symbol = Symbol('fail');
type Out = unknown; // the value itself, a stripped copy of it, or FAIL
type Obj = Record<string, unknown>;

// Scalars. The bounds are finite, so NaN and ±Infinity fail every range test.
const inRange = (v: unknown, min: number, max: number) => typeof v === 'number' && v >= min && v <= max;
/** A float4 column (zod: `real`). */
const real = (v: unknown, min: number, max: number) => inRange(v, min, max) && fitsFloat4(v as number);
const num = (v: unknown) => real(v, -FLOAT4_MAX, FLOAT4_MAX);
const nonNegative = (v: unknown) => real(v, 0, FLOAT4_MAX);
const angle = (v: unknown) => real(v, 0, 360);
const count = (v: unknown) => Number.isInteger(v) && (v as number) >= 0 && (v as number) <= INT4_MAX;
const latitude = (v: unknown) => inRange(v, -90, 90);
const longitude = (v: unknown) => inRange(v, -180, 180);
const unitId = (v: unknown) => typeof v === 'string' && UNIT_ID.test(v);
const timestamp = (v: unknown) => typeof v === 'string' && ISO_UTC.test(v) && isRealTime(v);
const intervalLength = (v: unknown) => Number.isInteger(v) && (v as number) >= 1 && (v as number) <= 3600;
const signedDegrees = (v: unknown) => real(v, -180, 180);
const absDegrees = (v: unknown) => real(v, 0, 180);
const percent = (v: unknown) => real(v, -100, 100);
const fraction = (v: unknown) => real(v, 0, 1);
const boolean = (v: unknown) => typeof v === 'boolean';
const modes: ReadonlySet<unknown> = new Set(STATION_MODES);
const kinds: ReadonlySet<unknown> = new Set(REF_KINDS);
const refKind = (v: unknown) => kinds.has(v);
/** An optional field: absent, or passing `check`. */
const opt = (v: unknown, check: (v: unknown) => boolean) => v === undefined || check(v);

const isObject = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** `o`'s fields named in `keys` (those present), with `replaced` ones swapped in: zod's output without unknown fields. */
function known(o: Obj, keys: readonly string[], replaced?: Obj): Obj {
  const out: Obj = {};
  for (const key of keys) {
    const value = replaced && key in replaced ? replaced[key] : o[key];
    if (value !== undefined) out[key] = value;
  }
  return out;
}

/**
 * `o` when it holds no more keys than the `present` known ones and nothing
 * inside was replaced, else a copy of its known fields.
 */
const result = (o: Obj, present: number, keys: readonly string[], replaced?: Obj): Obj =>
  replaced === undefined && keyCount(o) === present ? o : known(o, keys, replaced);

/**
 * The keys of `o`, counted without allocating an array (Object.keys was
 * about 2 % of the worker's garbage). for-in also sees inherited enumerable keys, which
 * JSON objects have none of; were there any, the count would only be too
 * high, and a correct copy made.
 */
function keyCount(o: Obj): number {
  let n = 0;
  for (const _ in o) n++;
  return n;
}

/** Note a checked nested value: `replaced` collects those that came back as copies. */
function replacing(key: string, before: unknown, after: Out, replaced: Obj | undefined): Obj | undefined {
  if (after === before) return replaced;
  const r = replaced ?? {};
  r[key] = after;
  return r;
}

const numbers = (v: unknown, check: (x: unknown) => boolean, min: number, max: number): boolean => {
  if (!Array.isArray(v) || v.length < min || v.length > max) return false;
  for (const x of v) if (!check(x)) return false;
  return true;
};

// --- station ---------------------------------------------------------------

const SP = ['lat', 'lon', 'hdg'];
function setPoint(v: unknown): Out {
  if (!isObject(v)) return FAIL;
  if (!latitude(v.lat) || !longitude(v.lon) || !angle(v.hdg)) return FAIL;
  return result(v, 3, SP);
}

const ERR = ['north_mean', 'east_mean', 'r_mean', 'r_rms', 'r_max', 'hist'];
function errorStats(v: unknown): Out {
  if (!isObject(v)) return FAIL;
  const { north_mean, east_mean, r_mean, r_rms, r_max, hist } = v;
  if (!opt(north_mean, num) || !opt(east_mean, num) || !opt(r_mean, nonNegative) || !opt(r_rms, nonNegative) || !opt(r_max, nonNegative)) return FAIL;
  if (hist !== undefined && !numbers(hist, count, 0, 101)) return FAIL;
  return result(v, has(north_mean) + has(east_mean) + has(r_mean) + has(r_rms) + has(r_max) + has(hist), ERR);
}

const HDG = ['mean', 'rms', 'max_abs'];
function headingStats(v: unknown): Out {
  if (!isObject(v)) return FAIL;
  const { mean, rms, max_abs } = v;
  if (!opt(mean, signedDegrees) || !opt(rms, absDegrees) || !opt(max_abs, absDegrees)) return FAIL;
  return result(v, has(mean) + has(rms) + has(max_abs), HDG);
}

const ENV = ['wind_ms', 'wind_gust_ms', 'wind_from_deg', 'current_ms', 'current_to_deg', 'residual_kn', 'residual_to_deg'];
function environment(v: unknown): Out {
  if (!isObject(v)) return FAIL;
  const { wind_ms, wind_gust_ms, wind_from_deg, current_ms, current_to_deg, residual_kn, residual_to_deg } = v;
  if (
    !opt(wind_ms, nonNegative) || !opt(wind_gust_ms, nonNegative) || !opt(wind_from_deg, angle) || !opt(current_ms, nonNegative) ||
    !opt(current_to_deg, angle) || !opt(residual_kn, nonNegative) || !opt(residual_to_deg, angle)
  ) {
    return FAIL;
  }
  const fields = has(wind_ms) + has(wind_gust_ms) + has(wind_from_deg) + has(current_ms) + has(current_to_deg) + has(residual_kn) + has(residual_to_deg);
  return result(v, fields, ENV);
}

/** 1 for a field that is there, 0 for one that is not (added up to count the known fields of an object). */
const has = (v: unknown) => (v === undefined ? 0 : 1);

/** An optional nested object: undefined when absent, else what its check returns. */
const nested = (v: unknown, check: (v: unknown) => Out): Out => (v === undefined ? undefined : check(v));

const STATION = ['v', 't', 'dt', 'mode', 'dp_s', 'n', 'sp', 'err', 'hdg_err', 'env'];
function station(o: unknown): Out {
  if (!isObject(o)) return FAIL;
  const { v, t, dt, mode, dp_s, n } = o;
  if (v !== 1 || !timestamp(t) || !intervalLength(dt)) return FAIL;
  if (!modes.has(mode) || !nonNegative(dp_s) || !count(n)) return FAIL;
  const sp = nested(o.sp, setPoint);
  const err = nested(o.err, errorStats);
  const hdgErr = nested(o.hdg_err, headingStats);
  const env = nested(o.env, environment);
  if (sp === FAIL || err === FAIL || hdgErr === FAIL || env === FAIL) return FAIL;
  // The refinements: dp_s within the interval, histogram counts adding up to n.
  if ((dp_s as number) > (dt as number)) return FAIL;
  const hist = (err as { hist?: number[] } | undefined)?.hist;
  if (hist !== undefined && sum(hist) !== n) return FAIL;
  let replaced = replacing('sp', o.sp, sp, undefined);
  replaced = replacing('err', o.err, err, replaced);
  replaced = replacing('hdg_err', o.hdg_err, hdgErr, replaced);
  replaced = replacing('env', o.env, env, replaced);
  return result(o, 6 + has(sp) + has(err) + has(hdgErr) + has(env), STATION, replaced);
}

// --- per-unit streams --------------------------------------------------------

const UNIT = ['id', 'run_s', 'starts', 'rpm', 'pitch_pct', 'load_pct_mean', 'load_pct_max', 'thrust_kn', 'power_kw', 'azimuth_deg', 'azimuth_travel_deg', 'load_band_s'];
function thrusterUnit(u: unknown): Out {
  if (!isObject(u)) return FAIL;
  const { id, run_s, starts, rpm, pitch_pct, load_pct_mean, load_pct_max, thrust_kn, power_kw, azimuth_deg, azimuth_travel_deg, load_band_s } = u;
  if (!unitId(id) || !nonNegative(run_s) || !count(starts)) return FAIL;
  if (!opt(rpm, num) || !opt(pitch_pct, percent) || !opt(load_pct_mean, nonNegative) || !opt(load_pct_max, nonNegative)) return FAIL;
  if (!opt(thrust_kn, num) || !opt(power_kw, nonNegative) || !opt(azimuth_deg, angle) || !opt(azimuth_travel_deg, nonNegative)) return FAIL;
  if (load_band_s !== undefined) {
    if (!numbers(load_band_s, nonNegative, 11, 11)) return FAIL;
    if (!bandsMatchRunTime(sum(load_band_s as number[]), run_s as number)) return FAIL;
  }
  const optional =
    has(rpm) + has(pitch_pct) + has(load_pct_mean) + has(load_pct_max) + has(thrust_kn) + has(power_kw) + has(azimuth_deg) + has(azimuth_travel_deg) + has(load_band_s);
  return result(u, 3 + optional, UNIT);
}

const BUS = ['id', 'kw_mean', 'kw_max', 'kw_available', 'gens_online', 'limit_s', 'limit_events', 'blackout'];
function powerBus(b: unknown): Out {
  if (!isObject(b)) return FAIL;
  const { id, kw_mean, kw_max, kw_available, gens_online, limit_s, limit_events, blackout } = b;
  if (!unitId(id) || !opt(kw_mean, nonNegative) || !opt(kw_max, nonNegative) || !opt(kw_available, nonNegative)) return FAIL;
  if (!opt(gens_online, count) || !opt(limit_s, nonNegative) || !opt(limit_events, count) || !opt(blackout, boolean)) return FAIL;
  const optional = has(kw_mean) + has(kw_max) + has(kw_available) + has(gens_online) + has(limit_s) + has(limit_events) + has(blackout);
  return result(b, 1 + optional, BUS);
}

const SYSTEM = ['id', 'kind', 'online_s', 'weight', 'sd_m', 'rejected'];
function refSystem(x: unknown): Out {
  if (!isObject(x)) return FAIL;
  const { id, kind, online_s, weight, sd_m, rejected } = x;
  if (!unitId(id) || !opt(kind, refKind) || !opt(online_s, nonNegative) || !opt(weight, fraction)) return FAIL;
  if (!opt(sd_m, nonNegative) || !opt(rejected, count)) return FAIL;
  return result(x, 1 + has(kind) + has(online_s) + has(weight) + has(sd_m) + has(rejected), SYSTEM);
}

/** No two units share an id: compared pairwise for the usual handful, through a Set beyond. */
function uniqueIds(items: Obj[]): boolean {
  if (items.length > 16) return new Set(items.map((item) => item.id)).size === items.length;
  for (let i = 1; i < items.length; i++) for (let j = 0; j < i; j++) if (items[i]!.id === items[j]!.id) return false;
  return true;
}

/**
 * A record of units (thrusters, buses, systems): v, t, dt, and at least one
 * unit, ids unique, `within` (when present) not beyond dt.
 */
function perUnit(list: string, unit: (u: unknown) => Out, within: string): (o: unknown) => Out {
  const keys = ['v', 't', 'dt', list];
  return (o) => {
    if (!isObject(o)) return FAIL;
    const { v, t, dt } = o;
    const items = o[list];
    if (v !== 1 || !timestamp(t) || !intervalLength(dt)) return FAIL;
    if (!Array.isArray(items) || items.length < 1) return FAIL;
    let copy: unknown[] | undefined;
    for (let i = 0; i < items.length; i++) {
      const out = unit(items[i]);
      if (out === FAIL) return FAIL;
      if (out !== items[i]) (copy ??= items.slice())[i] = out;
    }
    const checked = (copy ?? items) as Obj[];
    for (const item of checked) {
      const value = item[within];
      if (value !== undefined && (value as number) > (dt as number)) return FAIL;
    }
    if (!uniqueIds(checked)) return FAIL;
    return result(o, 4, keys, copy && { [list]: copy });
  };
}

const TRACK = ['v', 't', 'lat', 'lon', 'hdg', 'sp_lat', 'sp_lon', 'sp_hdg'];
const track = (o: unknown): Out => {
  if (!isObject(o)) return FAIL;
  const { v, t, lat, lon, hdg, sp_lat, sp_lon, sp_hdg } = o;
  if (v !== 1 || !timestamp(t) || !latitude(lat) || !longitude(lon)) return FAIL;
  if (!opt(hdg, angle) || !opt(sp_lat, latitude) || !opt(sp_lon, longitude) || !opt(sp_hdg, angle)) return FAIL;
  return result(o, 4 + has(hdg) + has(sp_lat) + has(sp_lon) + has(sp_hdg), TRACK);
};

const checks: Record<Stream, (o: unknown) => Out> = {
  station,
  thrusters: perUnit('units', thrusterUnit, 'run_s'),
  power: perUnit('buses', powerBus, 'limit_s'),
  refs: perUnit('systems', refSystem, 'online_s'),
  track,
};
