import { describe, expect, it } from 'vitest';
import type { z } from 'zod';
import { Random } from '../../seed/random';
import { isRealTime, powerRecord, refsRecord, stationRecord, SUM_TOLERANCE_S, thrustersRecord, trackRecord } from './schemas';

const t = '2026-11-15T11:00:00Z';
const station = { v: 1, t, dt: 60, mode: 'auto_position', dp_s: 60, n: 3 };
const unit = { id: 'T1', run_s: 60, starts: 0 };
const thrusters = (units: object[]) => ({ v: 1, t, dt: 60, units });
const bands = (sum: number) => [sum - 50, 10, 10, 10, 10, 10, 0, 0, 0, 0, 0];

/** The first issue of a failed parse as `path: message`, or 'ok'. */
function verdict(schema: z.ZodType, value: unknown): string {
  const r = schema.safeParse(value);
  if (r.success) return 'ok';
  const issue = r.error.issues[0]!;
  return `${issue.path.join('.')}: ${issue.message}`;
}

describe('timestamps', () => {
  it.each([
    ['2026-11-15T11:00:00Z'],
    ['2026-11-15T11:00:00.5Z'],
    ['2026-11-15T11:00:00.123Z'],
    ['2024-02-29T00:00:00Z'], // a leap day
    ['1990-06-15T12:00:00Z'],
    ['0001-01-01T00:00:00Z'],
    ['2026-12-31T23:59:59.999Z'],
  ])('accepts %s', (time) => {
    expect(verdict(stationRecord, { ...station, t: time })).toBe('ok');
  });

  it.each([
    ['2026-11-15T11:00:00', 'must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z'],
    ['2026-11-15T11:00:00+00:00', 'must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z'],
    ['2026-11-15T11:00:00.1234Z', 'must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z'],
    ['2026-11-15T11:00Z', 'must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z'],
    ['+002026-11-15T11:00:00Z', 'must be ISO 8601 UTC ending in Z, e.g. 2026-03-04T05:06:00Z'],
    ['2026-02-30T00:00:00Z', 'is not a real date and time'],
    ['2025-02-29T00:00:00Z', 'is not a real date and time'], // not a leap year
    ['2026-04-31T00:00:00Z', 'is not a real date and time'],
    ['2026-00-10T00:00:00Z', 'is not a real date and time'],
    ['2026-11-15T24:00:00Z', 'is not a real date and time'],
    ['2026-11-15T11:60:00Z', 'is not a real date and time'],
    ['2026-12-31T23:59:60Z', 'is not a real date and time'],
    ['0000-01-01T00:00:00Z', 'is not a real date and time'],
  ])('refuses %s', (time, message) => {
    expect(verdict(stationRecord, { ...station, t: time })).toBe(`t: ${message}`);
  });

  it('reads dates digit by digit exactly as a parse and print back through Date would', () => {
    // The definition isRealTime replaces: the parsed time prints back as sent, and year 0000 is refused.
    const throughDate = (s: string) => {
      const ms = Date.parse(s);
      return !Number.isNaN(ms) && !s.startsWith('0000') && new Date(ms).toISOString().slice(0, 19) === s.slice(0, 19);
    };
    const two = (n: number) => String(n).padStart(2, '0');
    const years = [0, 1, 2, 4, 99, 100, 400, 1600, 1700, 1899, 1900, 1969, 1970, 1999, 2000, 2023, 2024, 2025, 2100, 2400, 9996, 9999];
    const checked: string[] = [];
    for (const year of years) {
      for (let month = 0; month <= 13; month++) {
        for (let day = 0; day <= 32; day++) checked.push(`${String(year).padStart(4, '0')}-${two(month)}-${two(day)}T00:00:00Z`);
      }
    }
    for (const [h, m, sec] of [[0, 0, 0], [23, 59, 59], [24, 0, 0], [24, 0, 1], [23, 60, 0], [23, 59, 60], [25, 0, 0], [99, 99, 99], [12, 30, 45]]) {
      for (const fraction of ['', '.0', '.5', '.12', '.999']) checked.push(`2024-02-29T${two(h!)}:${two(m!)}:${two(sec!)}${fraction}Z`);
    }
    // And random strings of the same shape, digits anywhere.
    const rng = new Random(20261202);
    const digits = () => String(Math.floor(rng.next() * 10));
    for (let i = 0; i < 20_000; i++) checked.push('####-##-##T##:##:##Z'.replace(/#/g, digits));
    for (const s of checked) expect(isRealTime(s), s).toBe(throughDate(s));
  });
});

describe('dt', () => {
  it('takes whole seconds from 1 to 3600', () => {
    expect(verdict(stationRecord, { ...station, dt: 1, dp_s: 1 })).toBe('ok');
    expect(verdict(stationRecord, { ...station, dt: 3600 })).toBe('ok');
    expect(verdict(stationRecord, { ...station, dt: 0 })).toBe('dt: Too small: expected number to be >=1');
    expect(verdict(stationRecord, { ...station, dt: 3601 })).toBe('dt: Too big: expected number to be <=3600');
    expect(verdict(stationRecord, { ...station, dt: 59.5 })).toBe('dt: Invalid input: expected int, received number');
  });

  it('is not required for track, and ignored there', () => {
    expect(trackRecord.parse({ v: 1, t, lat: 1, lon: 2, dt: 'whatever' })).toEqual({ v: 1, t, lat: 1, lon: 2 });
  });
});

describe('values measured over the interval are at most dt', () => {
  it.each([
    ['station dp_s', stationRecord, (x: number) => ({ ...station, dp_s: x }), 'dp_s'],
    ['thruster run_s', thrustersRecord, (x: number) => thrusters([{ ...unit, run_s: x }]), 'run_s'],
    ['bus limit_s', powerRecord, (x: number) => ({ v: 1, t, dt: 60, buses: [{ id: 'A', limit_s: x }] }), 'limit_s'],
    ['reference online_s', refsRecord, (x: number) => ({ v: 1, t, dt: 60, systems: [{ id: 'R', online_s: x }] }), 'online_s'],
  ] as const)('%s', (_, schema, record, label) => {
    expect(verdict(schema, record(60))).toBe('ok');
    expect(verdict(schema, record(60.01))).toBe(`: ${label} must be ≤ dt (60)`);
    expect(verdict(schema, record(-0.01))).toMatch(/Too small: expected number to be >=0$/);
  });
});

describe('numbers the store can hold', () => {
  it('keeps integers within PostgreSQL integer', () => {
    expect(verdict(stationRecord, { ...station, n: 2_147_483_647 })).toBe('ok');
    expect(verdict(stationRecord, { ...station, n: 2_147_483_648 })).toBe('n: Too big: expected number to be <=2147483647');
    expect(verdict(thrustersRecord, thrusters([{ ...unit, starts: 2 ** 53 }]))).toBe('units.0.starts: Too big: expected int to be <=9007199254740991');
  });

  it('keeps 32-bit float fields within real: not too large, and not so small they would round to 0', () => {
    const rpm = (x: number) => thrusters([{ ...unit, rpm: x }]);
    expect(verdict(thrustersRecord, rpm(3.4e38))).toBe('ok');
    expect(verdict(thrustersRecord, rpm(-3.4e38))).toBe('ok');
    expect(verdict(thrustersRecord, rpm(3.5e38))).toBe('units.0.rpm: Too big: expected number to be <=3.4e+38');
    expect(verdict(thrustersRecord, rpm(0))).toBe('ok');
    expect(verdict(thrustersRecord, rpm(-1e-40))).toBe('ok'); // a subnormal float4
    expect(verdict(thrustersRecord, rpm(1e-45))).toBe('ok'); // rounds to the smallest float4
    expect(verdict(thrustersRecord, rpm(1e-46))).toBe('units.0.rpm: is too close to 0 for a 32-bit float');
    expect(verdict(thrustersRecord, rpm(-1e-300))).toBe('units.0.rpm: is too close to 0 for a 32-bit float');
    // Every float4 column has the rule, bounded fields included.
    expect(verdict(stationRecord, { ...station, hdg_err: { mean: 1e-50 } })).toBe('hdg_err.mean: is too close to 0 for a 32-bit float');
    expect(verdict(stationRecord, { ...station, sp: { lat: 0, lon: 0, hdg: 1e-50 } })).toBe('sp.hdg: is too close to 0 for a 32-bit float');
    expect(verdict(refsRecord, { v: 1, t, dt: 60, systems: [{ id: 'R', weight: 1e-50 }] })).toBe('systems.0.weight: is too close to 0 for a 32-bit float');
    expect(verdict(thrustersRecord, thrusters([{ ...unit, pitch_pct: -1e-50 }]))).toBe('units.0.pitch_pct: is too close to 0 for a 32-bit float');
    // lat/lon are double precision: a tiny value is fine there.
    expect(verdict(trackRecord, { v: 1, t, lat: 1e-300, lon: -1e-300 })).toBe('ok');
  });
});

describe('station', () => {
  it('needs mode, dp_s and n; the rest is optional and stays undefined', () => {
    expect(stationRecord.parse(station)).toEqual(station);
    expect(verdict(stationRecord, { ...station, n: undefined })).toBe('n: Invalid input: expected number, received undefined');
    expect(verdict(stationRecord, { ...station, mode: 'dp' })).toBe(
      'mode: Invalid option: expected one of "auto_position"|"auto_track"|"joystick"|"manual"|"standby"',
    );
  });

  it('wants histogram counts that add up to n exactly, in at most 101 bins', () => {
    expect(verdict(stationRecord, { ...station, err: { hist: [1, 2] } })).toBe('ok');
    expect(verdict(stationRecord, { ...station, n: 0, err: { hist: [] } })).toBe('ok');
    expect(verdict(stationRecord, { ...station, err: { hist: [...Array(100).fill(0), 3] } })).toBe('ok');
    expect(verdict(stationRecord, { ...station, err: { hist: [1, 1] } })).toBe('err.hist: counts must add up to n (3)');
    expect(verdict(stationRecord, { ...station, err: { hist: [1, 1, 1, 1] } })).toBe('err.hist: counts must add up to n (3)');
    expect(verdict(stationRecord, { ...station, err: { hist: [3, ...Array(101).fill(0)] } })).toBe('err.hist: Too big: expected array to have <=101 items');
    expect(verdict(stationRecord, { ...station, err: { hist: [4, -1] } })).toBe('err.hist.1: Too small: expected number to be >=0');
    expect(verdict(stationRecord, { ...station, err: { hist: [2.5, 0.5] } })).toBe('err.hist.0: Invalid input: expected int, received number');
  });

  it('bounds positions, angles and heading errors', () => {
    expect(verdict(stationRecord, { ...station, sp: { lat: 90, lon: -180, hdg: 360 } })).toBe('ok');
    expect(verdict(stationRecord, { ...station, sp: { lat: 90.0001, lon: 0, hdg: 0 } })).toBe('sp.lat: Too big: expected number to be <=90');
    expect(verdict(stationRecord, { ...station, env: { current_to_deg: -1 } })).toBe('env.current_to_deg: Too small: expected number to be >=0');
    expect(verdict(stationRecord, { ...station, hdg_err: { mean: -180, rms: 180, max_abs: 0 } })).toBe('ok');
    expect(verdict(stationRecord, { ...station, hdg_err: { rms: -0.1 } })).toBe('hdg_err.rms: Too small: expected number to be >=0');
  });
});

describe('thrusters', () => {
  it('allows load bands to miss run_s by the tolerance, both ways, and no more', () => {
    expect(SUM_TOLERANCE_S).toBe(1);
    for (const sum of [60, 59, 61, 59.5, 60.5]) expect(verdict(thrustersRecord, thrusters([{ ...unit, load_band_s: bands(sum) }]))).toBe('ok');
    expect(verdict(thrustersRecord, thrusters([{ ...unit, load_band_s: bands(61.25) }]))).toBe(
      'units.0.load_band_s: must add up to run_s (60), got 61.25',
    );
    expect(verdict(thrustersRecord, thrusters([{ ...unit, load_band_s: bands(58.75) }]))).toBe(
      'units.0.load_band_s: must add up to run_s (60), got 58.75',
    );
  });

  it('wants exactly 11 load bands', () => {
    expect(verdict(thrustersRecord, thrusters([{ ...unit, load_band_s: bands(60).slice(0, 10) }]))).toBe(
      'units.0.load_band_s: Too small: expected array to have exactly 11 items',
    );
    expect(verdict(thrustersRecord, thrusters([{ ...unit, load_band_s: [...bands(60), 0] }]))).toBe(
      'units.0.load_band_s: Too big: expected array to have exactly 11 items',
    );
  });

  it('needs at least one unit, each id once, ids of the register form', () => {
    expect(verdict(thrustersRecord, thrusters([]))).toBe('units: Too small: expected array to have >=1 items');
    expect(verdict(thrustersRecord, thrusters([unit, { ...unit, id: 'T2' }, { ...unit }]))).toBe('units: duplicate thruster id T1');
    expect(verdict(thrustersRecord, thrusters([{ ...unit, id: 't1' }, unit]))).toBe('ok'); // ids are case-sensitive
    expect(verdict(thrustersRecord, thrusters([{ ...unit, id: '' }]))).toBe('units.0.id: must match ^[A-Za-z0-9_-]{1,16}$');
    expect(verdict(thrustersRecord, thrusters([{ ...unit, id: 'T1/2' }]))).toBe('units.0.id: must match ^[A-Za-z0-9_-]{1,16}$');
  });

  it('keeps only id, run_s and starts required, so an idle unit may send nothing else', () => {
    expect(thrustersRecord.parse(thrusters([{ id: 'T1', run_s: 0, starts: 0 }])).units).toEqual([{ id: 'T1', run_s: 0, starts: 0 }]);
    expect(verdict(thrustersRecord, thrusters([{ id: 'T1', run_s: 0 }]))).toBe('units.0.starts: Invalid input: expected number, received undefined');
    expect(verdict(thrustersRecord, thrusters([{ ...unit, pitch_pct: -100 }]))).toBe('ok');
    expect(verdict(thrustersRecord, thrusters([{ ...unit, pitch_pct: -100.5 }]))).toBe('units.0.pitch_pct: Too small: expected number to be >=-100');
  });
});

describe('power and refs', () => {
  it('need at least one bus or system, each id once', () => {
    expect(verdict(powerRecord, { v: 1, t, dt: 60, buses: [] })).toBe('buses: Too small: expected array to have >=1 items');
    expect(verdict(powerRecord, { v: 1, t, dt: 60, buses: [{ id: 'A' }, { id: 'A' }] })).toBe('buses: duplicate bus id A');
    expect(verdict(refsRecord, { v: 1, t, dt: 60, systems: [] })).toBe('systems: Too small: expected array to have >=1 items');
    expect(verdict(refsRecord, { v: 1, t, dt: 60, systems: [{ id: 'R' }, { id: 'R' }] })).toBe('systems: duplicate reference system id R');
  });

  it('check field types and ranges', () => {
    expect(verdict(powerRecord, { v: 1, t, dt: 60, buses: [{ id: 'A', blackout: 0 }] })).toBe('buses.0.blackout: Invalid input: expected boolean, received number');
    expect(verdict(powerRecord, { v: 1, t, dt: 60, buses: [{ id: 'A', limit_events: -1 }] })).toBe('buses.0.limit_events: Too small: expected number to be >=0');
    expect(verdict(refsRecord, { v: 1, t, dt: 60, systems: [{ id: 'R', weight: 0 }, { id: 'S', weight: 1 }] })).toBe('ok');
    expect(verdict(refsRecord, { v: 1, t, dt: 60, systems: [{ id: 'R', weight: 1.01 }] })).toBe('systems.0.weight: Too big: expected number to be <=1');
    expect(verdict(refsRecord, { v: 1, t, dt: 60, systems: [{ id: 'R', kind: 'GNSS' }] })).toBe(
      'systems.0.kind: Invalid option: expected one of "gnss"|"hydroacoustic"|"laser"|"radar"|"taut_wire"|"other"',
    );
  });
});

describe('every stream', () => {
  it('wants v = 1 and strips unknown fields at every level', () => {
    expect(verdict(trackRecord, { v: 2, t, lat: 0, lon: 0 })).toBe('v: Invalid input: expected 1');
    expect(powerRecord.parse({ v: 1, t, dt: 60, vessel: 'other', buses: [{ id: 'A', phase: 3 }] })).toEqual({ v: 1, t, dt: 60, buses: [{ id: 'A' }] });
  });
});
