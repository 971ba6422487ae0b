import { z } from 'zod';

/**
 * The wire contract telemetry-v1 as zod schemas: the one source of truth for
 * field names, ranges and types, shared by ingest/, seed/ and the tests.
 * Unknown fields are ignored (zod strips them). Optional fields that are
 * missing stay undefined here and become NULL in the store — never 0.
 * Choices the contract leaves open are written down in docs/telemetry.md.
 */

export const STREAMS = ['station', 'thrusters', 'power', 'refs', 'track'] as const;
export type Stream = (typeof STREAMS)[number];

export const VESSEL_KEY = /^[a-z0-9][a-z0-9-]{1,31}$/;
export const UNIT_ID = /^[A-Za-z0-9_-]{1,16}$/;
/** ISO 8601 UTC with `Z`, optional milliseconds: 2026-03-04T05:06:00Z. */
export const ISO_UTC = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d{1,3})?Z$/;
export const STATION_MODES = ['auto_position', 'auto_track', 'joystick', 'manual', 'standby'] as const;
export const REF_KINDS = ['gnss', 'hydroacoustic', 'laser', 'radar', 'taut_wire', 'other'] as const;

/** Tolerance for sums the gateway rounds (load bands vs run time), seconds. Common practice, no source. */
export const SUM_TOLERANCE_S = 1;

// Stored as PostgreSQL real (float4) and integer (int4): values beyond those
// types' ranges are rejected here rather than failing a whole database batch.
// The predicates below are shared with the hand-written fast path
// (fastRecord.ts), so the two cannot drift apart on them.
export const FLOAT4_MAX = 3.4e38;
export const INT4_MAX = 2_147_483_647;
/** A float4 column: a non-zero value that would round to 0 there is refused by PostgreSQL ("out of range"). */
export const fitsFloat4 = (v: number) => v === 0 || Math.fround(v) !== 0;
const real = (min: number, max: number) => z.number().min(min).max(max).refine(fitsFloat4, 'is too close to 0 for a 32-bit float');

/**
 * A string matching ISO_UTC that names a real moment, written as
 * `toISOString` would write it: month 01–12, a day that exists in that month
 * (Gregorian leap years, proleptic as in JavaScript), hours 00–23, minutes
 * and seconds 00–59, and not year 0000, which PostgreSQL refuses. Date.parse
 * alone is not enough: it rolls 2026-02-30 over to March 2 and reads 24:00
 * as the next day. Read digit by digit, without building a Date: ingest
 * checks every record's `t` (schemas.test.ts proves it agrees with a parse
 * and print back through Date).
 */
export function isRealTime(s: string): boolean {
  const year = twoDigits(s, 0) * 100 + twoDigits(s, 2);
  const month = twoDigits(s, 5);
  const day = twoDigits(s, 8);
  const hour = twoDigits(s, 11);
  const minute = twoDigits(s, 14);
  const second = twoDigits(s, 17);
  return year >= 1 && month >= 1 && month <= 12 && day >= 1 && day <= daysInMonth(year, month) && hour <= 23 && minute <= 59 && second <= 59;
}

const twoDigits = (s: string, at: number) => (s.charCodeAt(at) - 48) * 10 + s.charCodeAt(at + 1) - 48;

function daysInMonth(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return month === 4 || month === 6 || month === 9 || month === 11 ? 30 : 31;
}

const num = real(-FLOAT4_MAX, FLOAT4_MAX);
const nonNegative = real(0, FLOAT4_MAX);
const count = z.number().int().min(0).max(INT4_MAX);
const angle = real(0, 360);
const unitId = z.string().regex(UNIT_ID, 'must match ^[A-Za-z0-9_-]{1,16}$');

const timestamp = z
  .string()
  .regex(ISO_UTC, 'must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z')
  .refine(isRealTime, 'is not a real date and time');

const dt = z.number().int().min(1).max(3600);

/** Added left to right from 0: zod's refinements and the fast path (fastRecord.ts) must reach the same float. */
export function sum(values: readonly number[]): number {
  let total = 0;
  for (const v of values) total += v;
  return total;
}

/** Load bands may miss run time by the rounding tolerance, inclusive. */
export const bandsMatchRunTime = (bands: number, runS: number) => !(Math.abs(bands - runS) > SUM_TOLERANCE_S);

const base = { v: z.literal(1), t: timestamp, dt };

/** A value measured over the interval may not exceed the interval length. */
function withinInterval<T extends { dt: number }>(value: (r: T) => (number | undefined)[], label: string) {
  return (record: T, ctx: z.RefinementCtx) => {
    for (const v of value(record)) {
      if (v !== undefined && v > record.dt) {
        ctx.addIssue({ code: 'custom', message: `${label} must be ≤ dt (${record.dt})` });
        return;
      }
    }
  };
}

function uniqueIds<T extends { id: string }>(label: string) {
  return (items: T[], ctx: z.RefinementCtx) => {
    const seen = new Set<string>();
    for (const item of items) {
      if (seen.has(item.id)) ctx.addIssue({ code: 'custom', message: `duplicate ${label} id ${item.id}` });
      seen.add(item.id);
    }
  };
}

export const stationRecord = z
  .object({
    ...base,
    mode: z.enum(STATION_MODES),
    dp_s: nonNegative,
    n: count,
    sp: z.object({ lat: z.number().min(-90).max(90), lon: z.number().min(-180).max(180), hdg: angle }).optional(),
    err: z
      .object({
        north_mean: num.optional(),
        east_mean: num.optional(),
        r_mean: nonNegative.optional(),
        r_rms: nonNegative.optional(),
        r_max: nonNegative.optional(),
        hist: z.array(count).max(101).optional(),
      })
      .optional(),
    hdg_err: z
      .object({
        mean: real(-180, 180).optional(),
        rms: real(0, 180).optional(),
        max_abs: real(0, 180).optional(),
      })
      .optional(),
    env: z
      .object({
        wind_ms: nonNegative.optional(),
        wind_gust_ms: nonNegative.optional(),
        wind_from_deg: angle.optional(),
        current_ms: nonNegative.optional(),
        current_to_deg: angle.optional(),
        residual_kn: nonNegative.optional(),
        residual_to_deg: angle.optional(),
      })
      .optional(),
  })
  .superRefine(withinInterval((r) => [r.dp_s], 'dp_s'))
  .superRefine((r, ctx) => {
    const hist = r.err?.hist;
    if (hist && sum(hist) !== r.n) {
      ctx.addIssue({ code: 'custom', path: ['err', 'hist'], message: `counts must add up to n (${r.n})` });
    }
  });

export const thrusterUnit = z
  .object({
    id: unitId,
    run_s: nonNegative,
    starts: count,
    rpm: num.optional(),
    pitch_pct: real(-100, 100).optional(),
    load_pct_mean: nonNegative.optional(),
    load_pct_max: nonNegative.optional(),
    thrust_kn: num.optional(),
    power_kw: nonNegative.optional(),
    azimuth_deg: angle.optional(),
    azimuth_travel_deg: nonNegative.optional(),
    load_band_s: z.array(nonNegative).length(11).optional(),
  })
  .superRefine((u, ctx) => {
    if (!u.load_band_s) return;
    const total = sum(u.load_band_s);
    if (!bandsMatchRunTime(total, u.run_s)) {
      ctx.addIssue({ code: 'custom', path: ['load_band_s'], message: `must add up to run_s (${u.run_s}), got ${total}` });
    }
  });

export const thrustersRecord = z
  .object({ ...base, units: z.array(thrusterUnit).min(1).superRefine(uniqueIds('thruster')) })
  .superRefine(withinInterval((r) => r.units.map((u) => u.run_s), 'run_s'));

export const powerBus = z.object({
  id: unitId,
  kw_mean: nonNegative.optional(),
  kw_max: nonNegative.optional(),
  kw_available: nonNegative.optional(),
  gens_online: count.optional(),
  limit_s: nonNegative.optional(),
  limit_events: count.optional(),
  blackout: z.boolean().optional(),
});

export const powerRecord = z
  .object({ ...base, buses: z.array(powerBus).min(1).superRefine(uniqueIds('bus')) })
  .superRefine(withinInterval((r) => r.buses.map((b) => b.limit_s), 'limit_s'));

export const refSystem = z.object({
  id: unitId,
  kind: z.enum(REF_KINDS).optional(),
  online_s: nonNegative.optional(),
  weight: real(0, 1).optional(),
  sd_m: nonNegative.optional(),
  rejected: count.optional(),
});

export const refsRecord = z
  .object({ ...base, systems: z.array(refSystem).min(1).superRefine(uniqueIds('reference system')) })
  .superRefine(withinInterval((r) => r.systems.map((s) => s.online_s), 'online_s'));

export const trackRecord = z.object({
  v: z.literal(1),
  t: timestamp,
  lat: z.number().min(-90).max(90),
  lon: z.number().min(-180).max(180),
  hdg: angle.optional(),
  sp_lat: z.number().min(-90).max(90).optional(),
  sp_lon: z.number().min(-180).max(180).optional(),
  sp_hdg: angle.optional(),
});

export const recordSchemas = {
  station: stationRecord,
  thrusters: thrustersRecord,
  power: powerRecord,
  refs: refsRecord,
  track: trackRecord,
} as const;

export type StationRecord = z.infer<typeof stationRecord>;
export type ThrustersRecord = z.infer<typeof thrustersRecord>;
export type PowerRecord = z.infer<typeof powerRecord>;
export type RefsRecord = z.infer<typeof refsRecord>;
export type TrackRecord = z.infer<typeof trackRecord>;
export type TelemetryRecord = {
  station: StationRecord;
  thrusters: ThrustersRecord;
  power: PowerRecord;
  refs: RefsRecord;
  track: TrackRecord;
};
