import { describe, expect, it } from 'vitest';
import { headingErrorStats, positionErrorStats } from './intervalStatistics';

describe('positionErrorStats', () => {
  it('bins radial errors in 0.1 m bins with an overflow bin and trims trailing zeros', () => {
    // 3-4-5 triangle: r = 0.5 m exactly (bin 5); 0.05 m (bin 0); 12 m (overflow bin 100).
    const s = positionErrorStats([0.3, 0.05, 12], [0.4, 0, 0]);
    expect(s.hist.length).toBe(101);
    expect(s.hist[0]).toBe(1);
    expect(s.hist[5]).toBe(1);
    expect(s.hist[100]).toBe(1);
    expect(s.hist.reduce((a, b) => a + b, 0)).toBe(3);
    expect(s.r_max).toBe(12);
    expect(s.r_rms).toBeCloseTo(Math.sqrt((0.25 + 0.0025 + 144) / 3), 3);
    expect(positionErrorStats([0.01, 0.02], [0, 0]).hist).toEqual([2]);
  });
});

describe('headingErrorStats', () => {
  it('gives mean, RMS and largest magnitude', () => {
    expect(headingErrorStats([1, -3, 2])).toEqual({ mean: 0, rms: 2.16, max_abs: 3 });
  });
});
