import { describe, expect, it } from 'vitest';
import { Random } from '../../seed/random';
import { HIST_BINS, addHistogram, emptyHistogram, mergeHistograms, radialPercentiles, radialQuantile } from './radialHistogram';
import { mergeRms } from './rms';

// Source of the formula: docs spec metrics-v1, "Station-keeping accuracy":
// q-quantile in the first bin k with C_k ≥ q·N, at 0.1·k + 0.1·(q·N − C_{k−1}) / H_k.

describe('radialQuantile, hand-worked', () => {
  // H = [2, 3, 5] (bins [0, 0.1), [0.1, 0.2), [0.2, 0.3)), N = 10, C = [2, 5, 10].
  //   q = 0.5:  q·N = 5   → k = 1 (C_1 = 5 ≥ 5): 0.1 + 0.1·(5 − 2)/3   = 0.2
  //   q = 0.95: q·N = 9.5 → k = 2:              0.2 + 0.1·(9.5 − 5)/5 = 0.29
  //   q = 0.99: q·N = 9.9 → k = 2:              0.2 + 0.1·(9.9 − 5)/5 = 0.298
  //   q = 0.1:  q·N = 1   → k = 0 (C_{−1} = 0): 0   + 0.1·1/2         = 0.05
  const h = [2, 3, 5];
  it('interpolates linearly inside the bin', () => {
    expect(radialQuantile(h, 0.5)!.m).toBeCloseTo(0.2, 12);
    expect(radialQuantile(h, 0.95)!.m).toBeCloseTo(0.29, 12);
    expect(radialQuantile(h, 0.99)!.m).toBeCloseTo(0.298, 12);
    expect(radialQuantile(h, 0.1)!.m).toBeCloseTo(0.05, 12);
    expect(radialQuantile(h, 1)!.m).toBeCloseTo(0.3, 12);
    expect(radialQuantile(h, 0.5)!.overflow).toBe(false);
  });

  it('skips empty bins: the first bin that reaches q·N has H_k > 0', () => {
    // H = [0, 4, 0, 0, 4], N = 8. q = 0.5: q·N = 4, C_1 = 4 → 0.1 + 0.1·4/4 = 0.2.
    // q = 0.51: q·N = 4.08; C_1..C_3 = 4 < 4.08; k = 4: 0.4 + 0.1·0.08/4 = 0.402.
    const g = [0, 4, 0, 0, 4];
    expect(radialQuantile(g, 0.5)!.m).toBeCloseTo(0.2, 12);
    expect(radialQuantile(g, 0.51)!.m).toBeCloseTo(0.402, 12);
  });

  it('reports a quantile in the overflow bin as 10, flagged "≥ 10 m"', () => {
    const g = new Array<number>(HIST_BINS).fill(0);
    g[0] = 90;
    g[100] = 10;
    expect(radialQuantile(g, 0.95)).toEqual({ m: 10, overflow: true });
    expect(radialQuantile(g, 0.9)).toEqual({ m: 0.1, overflow: false }); // C_0 = 90 reaches 90
    expect(radialQuantile(g, 0.5)!.m).toBeCloseTo(0.1 * (50 / 90), 12); // q·N = 50 in bin 0 of 90
  });

  it('is null with no samples, and refuses q outside (0, 1] and over-long histograms', () => {
    expect(radialQuantile([], 0.5)).toBeNull();
    expect(radialQuantile([0, 0, 0], 0.95)).toBeNull();
    expect(radialPercentiles(emptyHistogram())).toEqual({ p50: null, p95: null, p99: null });
    expect(() => radialQuantile(h, 0)).toThrow(RangeError);
    expect(() => radialQuantile(h, 1.01)).toThrow(RangeError);
    expect(() => addHistogram(emptyHistogram(), new Array(102).fill(0))).toThrow(RangeError);
  });
});

describe('mergeHistograms', () => {
  it('sums element-wise, with trailing bins omitted', () => {
    const h = mergeHistograms([[1, 2], [0, 0, 3], [4]]);
    expect(h).toBeInstanceOf(Float64Array);
    expect(h.length).toBe(HIST_BINS);
    expect(Array.from(h.slice(0, 4))).toEqual([5, 2, 3, 0]);
  });
});

describe('Rayleigh check values', () => {
  // Source: standard results of the Rayleigh distribution (as quoted in docs
  // spec metrics-v1): for a circular normal error with σ per axis,
  // r_q = σ·sqrt(−2·ln(1 − q)), RMS = √2·σ. The quantile relation follows
  // from the CDF F(r) = 1 − exp(−r²/(2σ²)).
  const rq = (sigma: number, q: number) => sigma * Math.sqrt(-2 * Math.log(1 - q));

  it('quantile constants match the spec: 1.1774σ, 2.4477σ, 3.0349σ', () => {
    expect(rq(1, 0.5)).toBeCloseTo(1.1774, 4);
    expect(rq(1, 0.95)).toBeCloseTo(2.4477, 4);
    expect(rq(1, 0.99)).toBeCloseTo(3.0349, 4);
  });

  it('merged interval histograms of Rayleigh samples give p50/p95/p99 within 0.1 m and RMS ≈ √2σ', () => {
    const sigma = 1.3;
    const rnd = new Random(20260304);
    const intervals = 4000;
    const perInterval = 60;
    const hists: number[][] = [];
    const rmsParts: { n: number; rms: number }[] = [];
    for (let i = 0; i < intervals; i++) {
      const hist = new Array<number>(HIST_BINS).fill(0);
      let ss = 0;
      for (let j = 0; j < perInterval; j++) {
        const r = sigma * Math.hypot(rnd.normal(), rnd.normal());
        hist[Math.min(100, Math.floor(r * 10))]! += 1;
        ss += r * r;
      }
      let last = HIST_BINS;
      while (last > 0 && hist[last - 1] === 0) last--;
      hists.push(hist.slice(0, last));
      rmsParts.push({ n: perInterval, rms: Math.sqrt(ss / perInterval) });
    }
    const h = mergeHistograms(hists);
    const { p50, p95, p99 } = radialPercentiles(h);
    expect(Math.abs(p50!.m - 1.1774 * sigma)).toBeLessThan(0.1);
    expect(Math.abs(p95!.m - 2.4477 * sigma)).toBeLessThan(0.1);
    expect(Math.abs(p99!.m - 3.0349 * sigma)).toBeLessThan(0.1);
    // 240,000 samples: the sampling error of the RMS is ~0.1 %, far below 1 %.
    expect(mergeRms(rmsParts)! / (Math.SQRT2 * sigma)).toBeCloseTo(1, 2);
  });
});
