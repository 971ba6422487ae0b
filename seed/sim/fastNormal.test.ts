import { describe, expect, it } from 'vitest';
import { SimRandom } from './fastNormal';

/** Standard normal CDF by the Abramowitz & Stegun 26.2.17 approximation (|error| < 7.5e-8). */
function phi(x: number): number {
  const t = 1 / (1 + 0.2316419 * Math.abs(x));
  const d = Math.exp(-0.5 * x * x) / Math.sqrt(2 * Math.PI);
  const p = d * t * (0.31938153 + t * (-0.356563782 + t * (1.781477937 + t * (-1.821255978 + t * 1.330274429))));
  return x >= 0 ? 1 - p : p;
}

describe('SimRandom.normal (ziggurat, Marsaglia & Tsang 2000)', () => {
  it('follows the standard normal distribution, tails included (1,000,000 draws)', () => {
    const rng = new SimRandom(20261202);
    const n = 1_000_000;
    const edges = [-Infinity, -4, -3.442619855899, -3, -2, -1, -0.5, 0, 0.5, 1, 2, 3, 3.442619855899, 4, Infinity];
    const counts = new Array<number>(edges.length - 1).fill(0);
    let sum = 0, sq = 0;
    for (let i = 0; i < n; i++) {
      const x = rng.normal();
      sum += x;
      sq += x * x;
      let k = 0;
      while (x >= edges[k + 1]!) k++;
      counts[k]!++;
    }
    expect(Math.abs(sum / n)).toBeLessThan(0.005); // 5 standard errors
    expect(Math.abs(sq / n - 1)).toBeLessThan(0.007);
    // Pearson's chi-squared over the bins (13 degrees of freedom: 99.9th percentile 34.5).
    let chi2 = 0;
    for (let k = 0; k < counts.length; k++) {
      const expected = n * (phi(edges[k + 1]!) - phi(edges[k]!));
      chi2 += (counts[k]! - expected) ** 2 / expected;
    }
    expect(chi2).toBeLessThan(34.5);
  });

  it('repeats for a seed', () => {
    const a = new SimRandom(5), b = new SimRandom(5);
    expect(Array.from({ length: 1000 }, () => a.normal())).toEqual(Array.from({ length: 1000 }, () => b.normal()));
  });
});
