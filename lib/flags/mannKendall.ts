import { normalCdf, normalUpperTail } from './normal';

/**
 * The Mann–Kendall trend test (H. B. Mann, "Nonparametric tests against
 * trend", Econometrica 13 (1945) 245–259; M. G. Kendall, Rank Correlation
 * Methods, Griffin 1975), with the formulas of R. O. Gilbert, Statistical
 * Methods for Environmental Pollution Monitoring, Van Nostrand Reinhold 1987,
 * §16.4 (pp. 208–213):
 *
 *   S      = Σ_{k<j} sgn(x_j − x_k)                                  (16.3)
 *   Var(S) = [n(n−1)(2n+5) − Σ_p t_p(t_p−1)(2t_p+5)] / 18           (16.4)
 *            t_p = the number of values in the p-th group of ties
 *   Z      = (S − 1)/√Var(S) if S > 0, 0 if S = 0, (S + 1)/√Var(S) if S < 0  (16.5)
 *
 * The ±1 is the continuity correction. Gilbert recommends the normal
 * approximation from n ≥ 10 (below that, his exact table A18), which is why
 * the flag job asks for at least 10 days of data. Missing days are simply
 * absent: the test only needs the values in time order, so a gap neither
 * counts as a value nor breaks the series.
 */

export interface MannKendallResult {
  n: number;
  s: number;
  varS: number;
  z: number;
  /** Two-sided p = 2·(1 − Φ(|Z|)). */
  pTwoSided: number;
  /** One-sided p against an upward trend, 1 − Φ(Z). */
  pIncreasing: number;
  /** One-sided p against a downward trend, Φ(Z). */
  pDecreasing: number;
}

/** Values in time order (equal spacing is not needed). Null with fewer than 3 values: no pair structure to test. */
export function mannKendall(values: readonly number[]): MannKendallResult | null {
  const n = values.length;
  if (n < 3) return null;
  let s = 0;
  for (let k = 0; k < n - 1; k++) {
    const xk = values[k]!;
    for (let j = k + 1; j < n; j++) s += Math.sign(values[j]! - xk);
  }
  const varS = (n * (n - 1) * (2 * n + 5) - tieTerm(values)) / 18;
  // Every value tied: no trend can be seen, Var(S) = 0.
  const z = varS <= 0 || s === 0 ? 0 : (s > 0 ? s - 1 : s + 1) / Math.sqrt(varS);
  return {
    n,
    s,
    varS,
    z,
    pTwoSided: Math.min(1, 2 * normalUpperTail(Math.abs(z))),
    pIncreasing: normalUpperTail(z),
    pDecreasing: normalCdf(z),
  };
}

/** Σ t(t−1)(2t+5) over groups of equal values (exact equality: daily figures are stored values, not recomputed). */
function tieTerm(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  let sum = 0;
  for (let i = 0; i < sorted.length; ) {
    let j = i + 1;
    while (j < sorted.length && sorted[j] === sorted[i]) j++;
    const t = j - i;
    sum += t * (t - 1) * (2 * t + 5);
    i = j;
  }
  return sum;
}
