import { describe, expect, it } from 'vitest';
import { Random } from '../../seed/random';
import { baselineWindow, fitNormalisation, huberRegression, p95Norm, type WeatherDay } from './normalisedAccuracy';

// Method: Huber M-estimation by IRLS (Huber 1964; Holland & Welsch 1977) of
// p95 = β0 + β1·W² (+ β2·U²); see normalisedAccuracy.ts. Synthetic data with a
// known answer: p95 = 0.8 + 0.004·W² (+ 0.5·U²).
const A = 0.8;
const B = 0.004;
const C = 0.5;
const truth = (w: number, u = 0) => A + B * w * w + C * u * u;

function baseline(n: number, seed: number, { noise = 0, outliers = 0, current = false } = {}): WeatherDay[] {
  const rnd = new Random(seed);
  return Array.from({ length: n }, (_, i) => {
    const wind_ms = 20 * rnd.next();
    const current_ms = current ? 1.2 * rnd.next() : null;
    let p95 = truth(wind_ms, current_ms ?? 0) * (1 + noise * rnd.normal());
    // Every k-th day a bad day (reference system fault): p95 three times what the weather explains.
    if (outliers > 0 && i % Math.round(1 / outliers) === 0) p95 *= 3;
    return { p95, wind_ms, current_ms };
  });
}

describe('huberRegression', () => {
  it('recovers exact coefficients despite 20 % gross outliers (OLS does not)', () => {
    const days = baseline(60, 1, { outliers: 0.2 });
    const x = days.map((d) => [1, d.wind_ms! ** 2]);
    const y = days.map((d) => d.p95);
    const huber = huberRegression(x, y)!;
    expect(huber.coef[0]).toBeCloseTo(A, 6);
    expect(huber.coef[1]).toBeCloseTo(B, 8);
    const ols = huberRegression(x, y, Infinity)!;
    expect(Math.abs(ols.coef[0]! - A)).toBeGreaterThan(0.1);
  });

  it('is null for a singular design (every day the same wind) or too few points', () => {
    expect(huberRegression([[1, 4], [1, 4], [1, 4]], [1, 2, 3])).toBeNull();
    expect(huberRegression([[1, 4], [1, 9]], [1, 2])).toBeNull();
  });
});

describe('fitNormalisation and p95Norm', () => {
  it('a day exactly as the weather predicts has ratio 1; twice as bad, 2', () => {
    const model = fitNormalisation(baseline(40, 2, { outliers: 0.1 }));
    expect(p95Norm(model, { p95: truth(15), wind_ms: 15 })).toBeCloseTo(1, 6);
    expect(p95Norm(model, { p95: 2 * truth(5), wind_ms: 5 })).toBeCloseTo(2, 6);
  });

  it('with noise and outliers the fit stays within 5 % of the truth', () => {
    const model = fitNormalisation(baseline(90, 3, { noise: 0.05, outliers: 0.15 }));
    for (const w of [0, 8, 16]) {
      expect(Math.abs(p95Norm(model, { p95: truth(w), wind_ms: w })! - 1)).toBeLessThan(0.05);
    }
  });

  it('uses current where sent, and the wind-only fit where not', () => {
    const days = baseline(60, 4, { current: true, outliers: 0.1 });
    const model = fitNormalisation(days);
    expect(model.windCurrent!.coef[2]).toBeCloseTo(C, 6);
    expect(p95Norm(model, { p95: truth(10, 1), wind_ms: 10, current_ms: 1 })).toBeCloseTo(1, 6);
    // Without current the wind-only model (which absorbs the mean current term) is used.
    expect(p95Norm(model, { p95: truth(10, 1), wind_ms: 10 })).not.toBeNull();
    expect(model.wind).not.toBeNull();
  });

  it('is null with too few baseline days, or without the day\'s p95 or wind', () => {
    const few = fitNormalisation(baseline(19, 5));
    expect(few.wind).toBeNull();
    expect(p95Norm(few, { p95: 1, wind_ms: 5 })).toBeNull();
    const model = fitNormalisation(baseline(20, 5));
    expect(p95Norm(model, { p95: 1, wind_ms: 5 })).not.toBeNull();
    expect(p95Norm(model, { p95: null, wind_ms: 5 })).toBeNull();
    expect(p95Norm(model, { p95: 1, wind_ms: null })).toBeNull();
    // days without wind do not count toward the minimum
    expect(fitNormalisation(baseline(20, 5).map((d, i) => (i === 0 ? { ...d, wind_ms: null } : d))).wind).toBeNull();
  });

  it('baseline window: the 90 days ending 30 days before the day', () => {
    expect(baselineWindow('2026-06-30')).toEqual({ from: '2026-03-03', to: '2026-05-31' });
  });
});
