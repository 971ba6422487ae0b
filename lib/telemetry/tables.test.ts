import { describe, expect, it } from 'vitest';
import { recordSchemas, type Stream, type TelemetryRecord } from './schemas';
import { tableSpecs } from './tables';

const T = '2026-11-15T11:00:00Z';
const record = <S extends Stream>(stream: S, value: unknown) => recordSchemas[stream].parse(value) as TelemetryRecord[S];
const fields = (lines: string) => lines.split('\n').slice(0, -1).map((line) => line.split('\t'));

describe('tableSpecs: records as COPY text lines', () => {
  it('writes a full station record in column order, and a minimal one with NULLs, never 0', () => {
    const full = record('station', {
      v: 1, t: T, dt: 60, mode: 'auto_position', dp_s: 59.5, n: 3,
      sp: { lat: 59.41, lon: 2.87, hdg: 215 },
      err: { north_mean: -0.2, east_mean: 0.1, r_mean: 0.4, r_rms: 0.45, r_max: 1.1, hist: [1, 2] },
      hdg_err: { mean: 0.01, rms: 0.3, max_abs: 0.9 },
      env: { wind_ms: 9.5, wind_gust_ms: 12.1, wind_from_deg: 230, current_ms: 0.4, current_to_deg: 300, residual_kn: 3, residual_to_deg: 1e-7 },
    });
    const spec = tableSpecs.station;
    expect(fields(spec.lines(7, full))).toEqual([
      ['7', T, '60', 'auto_position', '59.5', '3', '59.41', '2.87', '215', '-0.2', '0.1', '0.4', '0.45', '1.1', '{1,2}', '0.01', '0.3', '0.9', '9.5', '12.1', '230', '0.4', '300', '3', '1e-7'],
    ]);
    const minimal = fields(spec.lines(7, record('station', { v: 1, t: T, dt: 60, mode: 'standby', dp_s: 0, n: 0 })))[0]!;
    expect(minimal).toHaveLength(spec.columns.length);
    expect(minimal.slice(0, 6)).toEqual(['7', T, '60', 'standby', '0', '0']);
    expect(new Set(minimal.slice(6))).toEqual(new Set(['\\N']));
  });

  it('writes one line per unit, bus and reference system', () => {
    const thrusters = record('thrusters', {
      v: 1, t: T, dt: 60,
      units: [{ id: 'T1', run_s: 60, starts: 1, rpm: -150, load_band_s: [0, 0, 10, 30, 20, 0, 0, 0, 0, 0, 0] }, { id: 'T2', run_s: 0, starts: 0 }],
    });
    expect(fields(tableSpecs.thrusters.lines(3, thrusters))).toEqual([
      ['3', 'T1', T, '60', '60', '1', '-150', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N', '{0,0,10,30,20,0,0,0,0,0,0}'],
      ['3', 'T2', T, '60', '0', '0', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N'],
    ]);
    const power = record('power', { v: 1, t: T, dt: 60, buses: [{ id: 'A', kw_mean: 3100, gens_online: 2, blackout: false }, { id: 'B', blackout: true }] });
    expect(fields(tableSpecs.power.lines(3, power))).toEqual([
      ['3', 'A', T, '60', '3100', '\\N', '\\N', '2', '\\N', '\\N', 'f'],
      ['3', 'B', T, '60', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N', 't'],
    ]);
    const refs = record('refs', { v: 1, t: T, dt: 60, systems: [{ id: 'GNSS1', kind: 'gnss', online_s: 60, weight: 0.5, sd_m: 0.3, rejected: 0 }, { id: 'HPR1' }] });
    expect(fields(tableSpecs.refs.lines(3, refs))).toEqual([
      ['3', 'GNSS1', T, '60', 'gnss', '60', '0.5', '0.3', '0'],
      ['3', 'HPR1', T, '60', '\\N', '\\N', '\\N', '\\N', '\\N'],
    ]);
  });

  it('writes track offsets only when the record names its set point', () => {
    const withSetPoint = fields(tableSpecs.track.lines(1, record('track', { v: 1, t: T, lat: 59.0001, lon: 2, sp_lat: 59, sp_lon: 2 })))[0]!;
    expect(withSetPoint).toHaveLength(tableSpecs.track.columns.length);
    expect(Number(withSetPoint[8])).toBeCloseTo(11.1, 1); // 0.0001° of latitude ≈ 11.1 m north (exact offsets: lib/geo/wgs84.test.ts)
    expect(Number(withSetPoint[9])).toBeCloseTo(0, 6);
    expect(fields(tableSpecs.track.lines(1, record('track', { v: 1, t: T, lat: 59, lon: 2 })))).toEqual([
      ['1', T, '59', '2', '\\N', '\\N', '\\N', '\\N', '\\N', '\\N'],
    ]);
  });
});
