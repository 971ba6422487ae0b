import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fastRecord } from './fastRecord';
import { recordSchemas, STREAMS, type Stream } from './schemas';

/**
 * The fast path must agree with the zod schemas exactly: it accepts a record
 * if and only if zod does, and then returns what zod returns. Records are
 * built from valid ones of every shape and broken in up to four places, with
 * values chosen at the edges of the contract's ranges.
 */

const T = '2026-11-15T11:00:00Z';
const bands = (...v: number[]) => [...v, ...Array(11 - v.length).fill(0)];

/** Valid records of every stream: minimal, full, and borderline. */
const valid: Record<Stream, Record<string, unknown>[]> = {
  station: [
    { v: 1, t: T, dt: 60, mode: 'standby', dp_s: 0, n: 0 },
    {
      v: 1, t: '2026-11-15T11:00:00.123Z', dt: 60, mode: 'auto_position', dp_s: 60, n: 6,
      sp: { lat: -90, lon: 180, hdg: 360 },
      err: { north_mean: -0.2, east_mean: 0.1, r_mean: 0.4, r_rms: 0.45, r_max: 1.1, hist: [1, 2, 3] },
      hdg_err: { mean: -180, rms: 0, max_abs: 180 },
      env: { wind_ms: 9.5, wind_gust_ms: 12.1, wind_from_deg: 0, current_ms: 0.4, current_to_deg: 300, residual_kn: 3, residual_to_deg: 90 },
    },
    { v: 1, t: T, dt: 3600, mode: 'joystick', dp_s: 1e-45, n: 0, err: { hist: [] }, env: {} },
    { v: 1, t: T, dt: 60, mode: 'manual', dp_s: 0.5, n: 101, err: { hist: Array(101).fill(1) } },
    // The upper bounds where the records above hold the lower ones, so a nudge crosses each of them.
    {
      v: 1, t: T, dt: 1, mode: 'auto_track', dp_s: 1, n: 2147483647,
      sp: { lat: 90, lon: -180, hdg: 0 },
      err: { north_mean: 3.4e38, east_mean: -3.4e38, r_mean: 0, r_rms: 3.4e38, r_max: 1e-45 },
      hdg_err: { mean: 180, rms: 180, max_abs: 0 },
      env: { wind_ms: 0, wind_gust_ms: 3.4e38, wind_from_deg: 360, current_ms: 0, current_to_deg: 0, residual_kn: 0, residual_to_deg: 360 },
    },
  ],
  thrusters: [
    { v: 1, t: T, dt: 60, units: [{ id: 'T1', run_s: 0, starts: 0 }] },
    {
      v: 1, t: T, dt: 60,
      units: [
        { id: 'T1', run_s: 60, starts: 1, rpm: -150, pitch_pct: -100, load_pct_mean: 35.5, load_pct_max: 48.2, thrust_kn: 140.2, power_kw: 710, azimuth_deg: 360, azimuth_travel_deg: 4.5, load_band_s: bands(0, 0, 10, 30, 20) },
        { id: 'Aft_thr-2', run_s: 30, starts: 0, load_band_s: bands(0.1, 0.2, 0.3, 28.4) },
        { id: 'T3', run_s: 10, starts: 2, load_band_s: bands(9) },
      ],
    },
    {
      v: 1, t: T, dt: 1,
      units: [{ id: 'ABCDEFGHIJKLMNOP', run_s: 1, starts: 2147483647, rpm: 3.4e38, pitch_pct: 100, thrust_kn: -3.4e38, azimuth_deg: 0, load_band_s: bands(0, 0, 0, 0, 0, 0, 0, 0, 0, 0, 2) }],
    },
  ],
  power: [
    { v: 1, t: T, dt: 60, buses: [{ id: 'A' }] },
    { v: 1, t: T, dt: 60, buses: [{ id: 'A', kw_mean: 3100, kw_max: 3900, kw_available: 6000, gens_online: 2, limit_s: 60, limit_events: 2147483647, blackout: true }, { id: 'B', blackout: false }] },
  ],
  refs: [
    { v: 1, t: T, dt: 60, systems: [{ id: 'GNSS1' }] },
    { v: 1, t: T, dt: 60, systems: [{ id: 'GNSS1', kind: 'gnss', online_s: 60, weight: 1, sd_m: 0.3, rejected: 0 }, { id: 'HPR1', kind: 'taut_wire', weight: 0 }] },
    { v: 1, t: T, dt: 3600, systems: [{ id: 'L', kind: 'other', online_s: 3600, weight: 1e-45, sd_m: 0, rejected: 2147483647 }] },
  ],
  track: [
    { v: 1, t: T, lat: 0, lon: 0 },
    { v: 1, t: T, lat: 59.41, lon: -180, hdg: 215, sp_lat: 90, sp_lon: 2.87, sp_hdg: 0 },
  ],
};

/** The next double above (`+1`) or below (`-1`) `v`. */
function step(v: number, direction: 1 | -1): number {
  if (v === 0) return direction * Number.MIN_VALUE;
  const view = new DataView(new ArrayBuffer(8));
  view.setFloat64(0, v);
  view.setBigInt64(0, view.getBigInt64(0) + BigInt(v > 0 === direction > 0 ? 1 : -1));
  return view.getFloat64(0);
}

/** Every bound of the contract, a hair inside and outside it, and the float4 underflow. */
const BOUNDS = [0, 1, 60, 90, 100, 180, 360, 3600, 2147483647, 3.4e38];
const numericEdges = [
  ...BOUNDS.flatMap((b) => [b, -b, step(b, 1), step(b, -1), step(-b, 1), step(-b, -1), b + 0.5, b - 0.5, b + 1, b - 1, -b - 0.5, -b - 1]),
  1.401298464324817e-45, 7.006492321624085e-46, step(7.006492321624085e-46, 1), -1.401298464324817e-45, 1e-50, 2 ** 53,
  Infinity, -Infinity, NaN, -0,
];
/** Values of the wrong type or shape, and strings at the edges of the patterns. */
const otherEdges = [
  '60', '', 'T1', 'gnss', 'auto_position', 'Auto_position', true, false, null, [], {}, [1], { id: 'T9', run_s: 0, starts: 0 },
  '2026-02-30T00:00:00Z', '2026-11-15T11:00:00', '2026-11-15T11:00:00.1234Z', '2026-11-15T24:00:00Z', '0000-01-01T00:00:00Z',
  '1990-01-01T00:00:00Z', '2026-11-15 11:00:00Z', '2026-11-15T11:00:00.5Z', 'ABCDEFGHIJKLMNOP', 'ABCDEFGHIJKLMNOPQ', 'T 1', 'Ø1', 'T1\n',
];
const anyValue = fc.oneof(
  { arbitrary: fc.constantFrom<unknown>(...numericEdges), weight: 6 },
  { arbitrary: fc.constantFrom<unknown>(...otherEdges), weight: 3 },
  { arbitrary: fc.jsonValue({ maxDepth: 2 }), weight: 1 },
  { arbitrary: fc.double(), weight: 1 },
  { arbitrary: fc.string({ maxLength: 20 }), weight: 1 },
);
/** Small changes of a number: sums and `≤ dt` rules are broken by a hair, or by the tolerance. */
const nudges = [1, -1, 0.5, -0.5, 1.0000001, -1.0000001, 1e-9, -1e-9];

type Mutation = { at: number; kind: 'set' | 'nudge' | 'delete' | 'unknown' | 'duplicate'; value: unknown; nudge: number };
const mutation: fc.Arbitrary<Mutation> = fc.record({
  at: fc.nat(),
  kind: fc.constantFrom('set', 'set', 'set', 'nudge', 'nudge', 'nudge', 'delete', 'unknown', 'duplicate'),
  value: anyValue,
  nudge: fc.nat(),
});

/** Every object and array in `root`, with the key of each value inside them. */
function places(root: unknown): { holder: Record<string, unknown> | unknown[]; key: string | number }[] {
  const out: { holder: Record<string, unknown> | unknown[]; key: string | number }[] = [];
  const walk = (v: unknown) => {
    if (v === null || typeof v !== 'object') return;
    for (const [k, child] of Object.entries(v)) {
      out.push({ holder: v as Record<string, unknown>, key: Array.isArray(v) ? Number(k) : k });
      walk(child);
    }
  };
  walk(root);
  return out;
}

function mutate(record: Record<string, unknown>, mutations: Mutation[]): Record<string, unknown> {
  const copy = structuredClone(record);
  for (const m of mutations) {
    const all = places(copy);
    const { holder, key } = all[m.at % all.length]!;
    const h = holder as Record<string | number, unknown>;
    if (m.kind === 'set') h[key] = structuredClone(m.value);
    else if (m.kind === 'nudge' && typeof h[key] === 'number') {
      const v = h[key] as number;
      const k = m.nudge % (nudges.length + 2);
      h[key] = k < nudges.length ? v + nudges[k]! : step(v, k === nudges.length ? 1 : -1);
    }
    else if (m.kind === 'delete') {
      if (Array.isArray(holder)) holder.splice(key as number, 1);
      else delete h[key];
    } else if (m.kind === 'unknown' && !Array.isArray(holder)) h[`x_${m.at % 5}`] = structuredClone(m.value);
    else if (m.kind === 'duplicate' && Array.isArray(holder)) holder.push(structuredClone(holder[key as number]));
    else if (m.kind === 'duplicate' && typeof h[key] === 'object' && Array.isArray(h[key])) (h[key] as unknown[]).push(0);
  }
  return copy;
}

function agree(stream: Stream, item: unknown) {
  const fast = fastRecord(stream, item);
  const zod = recordSchemas[stream].safeParse(item);
  expect(fast !== undefined, JSON.stringify(item)).toBe(zod.success);
  if (zod.success) expect(fast).toStrictEqual(zod.data);
}

describe('fastRecord agrees with the zod schemas', () => {
  it('on every valid record, and returns it without a copy', () => {
    for (const stream of STREAMS) {
      for (const record of valid[stream]) {
        agree(stream, record);
        expect(fastRecord(stream, record)).toBe(record);
      }
    }
  });

  it('drops unknown fields at every level, as zod does, and leaves the input as it was', () => {
    const record = structuredClone(valid.thrusters[1]!) as { units: Record<string, unknown>[]; [k: string]: unknown };
    record.firmware = '1.2';
    record.units[1]!.note = { deep: [1, 2] };
    const before = structuredClone(record);
    agree('thrusters', record);
    const out = fastRecord('thrusters', record) as unknown as typeof record;
    expect(out).not.toHaveProperty('firmware');
    expect(out.units[1]).not.toHaveProperty('note');
    expect(out.units[0]).toBe(record.units[0]); // untouched parts are shared, not copied
    expect(record).toStrictEqual(before);
  });

  it('on valid records broken in up to four places, edges of every range included', () => {
    const cases = fc.constantFrom(...STREAMS).chain((stream) =>
      fc.tuple(fc.constant(stream), fc.constantFrom(...valid[stream]), fc.array(mutation, { minLength: 1, maxLength: 4 })),
    );
    fc.assert(
      fc.property(cases, ([stream, record, mutations]) => agree(stream, mutate(record, mutations))),
      { numRuns: 30_000 },
    );
  }, 120_000); // many runs: the rarer edges need them (a slow machine is not a failure)

  it('on records read back from JSON text, 1e999 included', () => {
    const cases = fc.constantFrom(...STREAMS).chain((stream) =>
      fc.tuple(fc.constant(stream), fc.constantFrom(...valid[stream]), fc.array(mutation, { maxLength: 3 }), fc.nat()),
    );
    fc.assert(
      fc.property(cases, ([stream, record, mutations, at]) => {
        let text = JSON.stringify(mutate(record, mutations));
        const numbers = [...text.matchAll(/(?<=[:,[])-?\d+(?:\.\d+)?(?:e[+-]?\d+)?(?=[,\]}])/gi)];
        const m = numbers[at % (numbers.length + 1)];
        if (m) text = text.slice(0, m.index) + '1e999' + text.slice(m.index + m[0].length);
        agree(stream, JSON.parse(text));
      }),
      { numRuns: 5_000 },
    );
  });

  it('on arbitrary values', () => {
    fc.assert(
      fc.property(fc.constantFrom(...STREAMS), fc.oneof(fc.jsonValue({ maxDepth: 3 }), fc.anything({ maxDepth: 2 })), (stream, value) => agree(stream, value)),
      { numRuns: 5_000 },
    );
  });
});
