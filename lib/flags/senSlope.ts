import { normalQuantile } from './normal';

/**
 * Sen's slope estimator and its confidence interval (P. K. Sen, "Estimates
 * of the regression coefficient based on Kendall's tau", J. Amer. Statist.
 * Assoc. 63 (1968) 1379–1389), as R. O. Gilbert, Statistical Methods for
 * Environmental Pollution Monitoring (1987), §16.5 (pp. 217–219) gives it:
 *
 *   Q_i = (x_j − x_k)/(t_j − t_k) for every pair k < j; the slope is the
 *   median of the N′ values Q_i.
 *   C_α = z_{1−α/2}·√Var(S) (Var(S) of the Mann–Kendall test, ties included),
 *   M1 = (N′ − C_α)/2, M2 = (N′ + C_α)/2; the limits are the M1-th and the
 *   (M2+1)-th of the Q_i in increasing order.                       (16.6–16.7)
 *
 * Times are day numbers, so a missing day is a gap in t, not a zero, and the
 * slope is per day. Gilbert interpolates when M1 or M2+1 is not a whole
 * number; so do we (linearly between neighbouring ordered slopes), and clamp
 * the ranks to 1…N′ for very short series.
 */

export interface SenSlope {
  /** Median pairwise slope, units of x per unit of t. */
  slope: number;
  lower: number;
  upper: number;
  /** Confidence level of [lower, upper], e.g. 0.95. */
  confidence: number;
  pairs: number;
}

/** The value at 1-based rank r (fractional: linear interpolation) of an increasing array. */
function atRank(sorted: Float64Array, r: number): number {
  const i = Math.min(Math.max(r, 1), sorted.length) - 1;
  const lo = Math.floor(i);
  const hi = Math.min(lo + 1, sorted.length - 1);
  return sorted[lo]! + (i - lo) * (sorted[hi]! - sorted[lo]!);
}

/**
 * `t` and `x` of equal length, t strictly increasing. `varS` is Var(S) of the
 * Mann–Kendall test on the same x. Null with fewer than 2 points.
 */
export function senSlope(t: readonly number[], x: readonly number[], varS: number, confidence = 0.95): SenSlope | null {
  const n = x.length;
  if (n !== t.length) throw new Error('senSlope: t and x differ in length');
  if (n < 2) return null;
  const q = new Float64Array((n * (n - 1)) / 2);
  let m = 0;
  for (let k = 0; k < n - 1; k++) {
    for (let j = k + 1; j < n; j++) q[m++] = (x[j]! - x[k]!) / (t[j]! - t[k]!);
  }
  q.sort();
  const median = m % 2 === 1 ? q[(m - 1) / 2]! : (q[m / 2 - 1]! + q[m / 2]!) / 2;
  const c = normalQuantile(1 - (1 - confidence) / 2) * Math.sqrt(Math.max(varS, 0));
  return { slope: median, lower: atRank(q, (m - c) / 2), upper: atRank(q, (m + c) / 2 + 1), confidence, pairs: m };
}
