import { describe, expect, it } from 'vitest';
import type { StationRecord } from '../telemetry/schemas';
import { stationDayFigures } from './stationDay';

// Source: docs spec metrics-v1 "Station-keeping accuracy" (DP intervals only;
// no DP intervals → null accuracy figures, never 0; dp_hours over all intervals).
const rec = (over: Partial<StationRecord>): StationRecord => ({
  v: 1,
  t: '2026-03-04T05:06:00Z',
  dt: 60,
  mode: 'auto_position',
  dp_s: 60,
  n: 0,
  ...over,
});

describe('stationDayFigures', () => {
  it('merges DP intervals only', () => {
    const day = stationDayFigures(
      [
        rec({ n: 5, err: { hist: [2, 3], r_rms: 0.1, r_max: 0.19 }, hdg_err: { rms: 0.2, max_abs: 0.5 }, env: { wind_ms: 10, wind_gust_ms: 12 } }),
        rec({ n: 5, err: { hist: [0, 0, 5], r_rms: 0.25, r_max: 0.29 }, env: { wind_ms: 4 } }),
        // joystick: not a DP interval, but its dp_s counts toward dp_hours
        rec({ mode: 'joystick', dp_s: 1800, dt: 3600, n: 10, err: { hist: [0, 0, 0, 0, 10], r_max: 9 }, env: { wind_gust_ms: 30 } }),
      ],
      [0.15],
    );
    expect(day.dp_hours).toBeCloseTo((60 + 60 + 1800) / 3600, 12);
    expect(day.dp_intervals).toBe(2);
    expect(day.samples).toBe(10);
    // H = [2, 3, 5]: the hand-worked example of radialHistogram.test.ts
    expect(day.p50!.m).toBeCloseTo(0.2, 12);
    expect(day.p95!.m).toBeCloseTo(0.29, 12);
    expect(day.within_pct.get(0.15)).toBeCloseTo(35, 10);
    expect(day.r_rms).toBeCloseTo(Math.sqrt((5 * 0.01 + 5 * 0.0625) / 10), 12);
    expect(day.r_max).toBe(0.29);
    expect(day.hdg_rms).toBe(0.2);
    expect(day.wind_ms_mean).toBe(7);
    expect(day.wind_gust_ms_max).toBe(12);
  });

  it('a day without DP intervals has null accuracy figures', () => {
    const day = stationDayFigures([rec({ mode: 'manual', dp_s: 0, n: 60, err: { hist: [60], r_rms: 0.01, r_max: 0.05 } })], [5]);
    expect(day).toEqual({
      dp_hours: 0,
      dp_intervals: 0,
      samples: 0,
      p50: null,
      p95: null,
      p99: null,
      r_rms: null,
      r_max: null,
      within_pct: new Map([[5, null]]),
      hdg_rms: null,
      hdg_max_abs: null,
      wind_ms_mean: null,
      current_ms_mean: null,
      wind_gust_ms_max: null,
    });
  });
});
