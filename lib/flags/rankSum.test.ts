import { describe, expect, it } from 'vitest';
import { rankSum } from './rankSum';

describe('Wilcoxon–Mann–Whitney rank-sum test', () => {
  it('matches the published two-sample example: W = 35, one-sided p = 0.1272', () => {
    // Source: M. Hollander and D. A. Wolfe, Nonparametric Statistical Methods (1973), pp. 69f.:
    // permeability constants of the human chorioamnion at term (x) and at 12–26 weeks (y),
    // alternative "x greater"; W = 35 and the exact p = 0.1272 as R's wilcox.test reports them
    // in its documented example (from memory).
    const x = [0.8, 0.83, 1.89, 1.04, 1.45, 1.38, 1.91, 1.64, 0.73, 1.46];
    const y = [1.15, 0.88, 0.9, 0.74, 1.21];
    const r = rankSum(x, y)!;
    expect(r.w).toBe(35);
    expect(r.exact).toBe(true);
    expect(r.pGreater).toBeCloseTo(0.1272, 4);
    // The same data the other way round: W' = mn − W, and its lower tail is the same probability.
    const swapped = rankSum(y, x)!;
    expect(swapped.w).toBe(50 - 35);
    expect(swapped.pLess).toBeCloseTo(r.pGreater, 12);
  });

  it('three days above all of thirty: exactly 1 / C(33, 3) = 1/5456 (computed)', () => {
    const baseline = Array.from({ length: 30 }, (_, i) => i / 10);
    const r = rankSum([10, 11, 12], baseline)!;
    expect(r.w).toBe(90);
    expect(r.pGreater).toBeCloseTo(1 / 5456, 12);
    expect(r.pLess).toBe(1);
  });

  it('with ties, counts the permutation distribution of the mid-ranks (checked by enumerating every split)', () => {
    const x = [0, 2, 2, 5];
    const y = [0, 0, 1, 2, 2, 3, 7];
    const r = rankSum(x, y)!;
    // Independent check: enumerate all C(11, 4) = 330 ways to pick x's positions among the pooled values.
    const pooled = [...x, ...y];
    const wOf = (pick: number[]) => {
      const inX = new Set(pick);
      let w = 0;
      for (const i of inX) for (let j = 0; j < pooled.length; j++) if (!inX.has(j)) w += pooled[i]! > pooled[j]! ? 1 : pooled[i] === pooled[j] ? 0.5 : 0;
      return w;
    };
    const all: number[] = [];
    const choose = (from: number, pick: number[]) => {
      if (pick.length === 4) return void all.push(wOf(pick));
      for (let i = from; i < pooled.length; i++) choose(i + 1, [...pick, i]);
    };
    choose(0, []);
    expect(all).toHaveLength(330);
    expect(r.w).toBe(wOf([0, 1, 2, 3]));
    expect(r.pGreater).toBeCloseTo(all.filter((w) => w >= r.w - 1e-9).length / 330, 12);
    expect(r.pLess).toBeCloseTo(all.filter((w) => w <= r.w + 1e-9).length / 330, 12);
  });

  it('uses the normal approximation for larger samples, close to the exact count in the body', () => {
    const x = [3.1, 4.2, 2.8, 5.0, 4.4, 3.9, 4.8, 3.3, 4.1, 5.2, 4.6, 3.7];
    const y = [2.9, 3.0, 3.8, 2.5, 3.4, 4.0, 2.7, 3.6, 3.2, 2.6, 4.3, 3.5];
    const exact = rankSum(x, y)!;
    const approx = rankSum(x, y, 0)!;
    expect(exact.exact).toBe(true);
    expect(approx.exact).toBe(false);
    expect(approx.w).toBe(exact.w);
    expect(Math.abs(approx.pGreater - exact.pGreater)).toBeLessThan(0.003);
  });

  it('refuses empty or non-finite samples', () => {
    expect(rankSum([], [1, 2])).toBeNull();
    expect(rankSum([1, Number.NaN], [1, 2])).toBeNull();
  });
});
