import { describe, expect, it } from 'vitest';
import { HIST_BINS } from './radialHistogram';
import { withinPct } from './withinLimit';

// Source: docs spec metrics-v1: within_pct(L) = 100·(count below L)/N, the bin
// containing L contributing the fraction of its width below L.
describe('withinPct', () => {
  // H = [2, 3, 5], N = 10.
  //   L = 0.15: k = 1, f = 0.5 → 100·(2 + 0.5·3)/10 = 35
  //   L = 0.25: k = 2, f = 0.5 → 100·(5 + 0.5·5)/10 = 75
  //   L = 0.1:  k = 1, f = 0   → 100·2/10 = 20 (bin edge: bin 1 starts at L)
  //   L = 0.3:  all three bins below → 100
  const h = [2, 3, 5];
  it('counts the fraction of the bin that contains L', () => {
    expect(withinPct(h, 0.15)).toBeCloseTo(35, 10);
    expect(withinPct(h, 0.25)).toBeCloseTo(75, 10);
    expect(withinPct(h, 0.1)).toBeCloseTo(20, 10);
    expect(withinPct(h, 0.3)).toBeCloseTo(100, 10);
    expect(withinPct(h, 5)).toBeCloseTo(100, 10);
    expect(withinPct(h, 0)).toBe(0);
  });

  it('puts a limit on a bin edge exactly on the edge (0.3·10 = 3, not 0.3/0.1 = 2.99…)', () => {
    expect(withinPct([0, 0, 0, 7, 3], 0.3)).toBe(0);
    expect(withinPct([0, 0, 0, 7, 3], 0.4)).toBe(70);
  });

  it('counts none of the overflow bin (exact at 10 m, a lower bound beyond)', () => {
    const g = new Array<number>(HIST_BINS).fill(0);
    g[0] = 90;
    g[100] = 10;
    expect(withinPct(g, 10)).toBe(90);
    expect(withinPct(g, 25)).toBe(90);
    expect(withinPct(g, 0.05)).toBeCloseTo(45, 10);
  });

  it('is null with no samples and refuses negative limits', () => {
    expect(withinPct([], 5)).toBeNull();
    expect(withinPct([0, 0], 5)).toBeNull();
    expect(() => withinPct(h, -1)).toThrow(RangeError);
    expect(() => withinPct(h, Number.NaN)).toThrow(RangeError);
  });
});
