import { describe, expect, it } from 'vitest';
import { mannKendall } from './mannKendall';
import { senSlope } from './senSlope';

describe("Sen's slope", () => {
  it('is exact on a straight line, gaps in time included (any estimator must be; no source needed)', () => {
    const t = [0, 1, 2, 5, 6, 9];
    const x = t.map((d) => 3 - 0.25 * d);
    const sen = senSlope(t, x, mannKendall(x)!.varS)!;
    expect(sen.slope).toBeCloseTo(-0.25, 12);
    expect(sen.lower).toBeCloseTo(-0.25, 12);
    expect(sen.upper).toBeCloseTo(-0.25, 12);
  });

  // Source: Gilbert (1987) §16.5.1: C_α = z_{1−α/2}·√Var(S), M1 = (N′ − C_α)/2, M2 = (N′ + C_α)/2;
  // limits = the M1-th and (M2+1)-th ordered slopes. Here N′ = 10 (n = 5), Var(S) = 5·4·15/18 = 16.667,
  // C = 1.96·4.0825 = 8.0016, M1 = 0.9992, M2 + 1 = 10.0008: the limits are (to interpolation) the
  // smallest and largest pairwise slopes.
  it('takes the M1-th and (M2+1)-th ordered slopes as limits (Gilbert eq. 16.6–16.7)', () => {
    const x = [1, 4, 2, 6, 7];
    const t = [1, 2, 3, 4, 5];
    const r = mannKendall(x)!;
    expect(r.varS).toBeCloseTo(16.667, 3);
    const sen = senSlope(t, x, r.varS)!;
    const slopes: number[] = [];
    for (let i = 0; i < 5; i++) for (let j = i + 1; j < 5; j++) slopes.push((x[j]! - x[i]!) / (t[j]! - t[i]!));
    slopes.sort((a, b) => a - b);
    expect(sen.slope).toBeCloseTo((slopes[4]! + slopes[5]!) / 2, 12);
    expect(sen.lower).toBeCloseTo(slopes[0]!, 2);
    expect(sen.upper).toBeCloseTo(slopes[9]!, 2);
  });

  it('narrows the interval at a lower confidence', () => {
    const x = [2, 3, 3.5, 5, 4.8, 6, 7.2, 7, 8.5, 9, 9.4, 11];
    const t = x.map((_, i) => i);
    const v = mannKendall(x)!.varS;
    const wide = senSlope(t, x, v, 0.99)!;
    const narrow = senSlope(t, x, v, 0.8)!;
    expect(narrow.upper - narrow.lower).toBeLessThan(wide.upper - wide.lower);
    expect(narrow.lower).toBeGreaterThanOrEqual(wide.lower);
  });
});
