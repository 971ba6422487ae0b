import { describe, expect, it } from 'vitest';
import { environmentFigures } from './environment';

// Source: docs spec metrics-v1: environment over DP intervals weighted by dt:
// mean wind, mean current; max gust.
describe('environmentFigures', () => {
  it('weights means by dt over the intervals that sent the field', () => {
    const f = environmentFigures([
      { dt: 60, env: { wind_ms: 10, wind_gust_ms: 14, current_ms: 0.5 } },
      { dt: 30, env: { wind_ms: 4, wind_gust_ms: 16 } },
      { dt: 60, env: undefined },
    ]);
    expect(f.wind_ms_mean).toBeCloseTo((60 * 10 + 30 * 4) / 90, 12); // 8
    expect(f.current_ms_mean).toBe(0.5); // only the first interval sent current
    expect(f.wind_gust_ms_max).toBe(16);
  });

  it('is null, never 0, when nothing was sent', () => {
    expect(environmentFigures([{ dt: 60, env: {} }])).toEqual({ wind_ms_mean: null, current_ms_mean: null, wind_gust_ms_max: null });
    expect(environmentFigures([])).toEqual({ wind_ms_mean: null, current_ms_mean: null, wind_gust_ms_max: null });
  });
});
