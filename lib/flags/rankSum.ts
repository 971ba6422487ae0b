import { normalUpperTail } from './normal';

/**
 * The Wilcoxon–Mann–Whitney rank-sum test of two independent samples
 * (F. Wilcoxon, Biometrics Bulletin 1 (1945) 80–83; H. B. Mann and D. R.
 * Whitney, Ann. Math. Statist. 18 (1947) 50–60), one-sided both ways.
 *
 * W is the Mann–Whitney count for x: the number of pairs (x_i, y_j) with
 * x_i > y_j, ties counting ½ (= the sum of x's mid-ranks − m(m+1)/2, the W
 * that R's wilcox.test reports). Its null distribution is the permutation
 * distribution of the mid-ranks over all C(m+n, m) ways to pick x's
 * positions:
 * - exact when the smaller sample has at most EXACT_MAX values, counted by
 *   dynamic programming over doubled mid-ranks (integers even with ties),
 *   so a few days can be tested against a month without the normal
 *   approximation, which is far off in the tails at such sizes (3 days
 *   above all of 30: exactly 1/5456 = 0.00018, approximately 0.0027);
 * - otherwise the normal approximation with the tie correction of the
 *   variance and a continuity correction of ½ (Hollander and Wolfe,
 *   Nonparametric Statistical Methods, 1973, §4.1 — from memory).
 *
 * The flag job uses it to confirm a CUSUM signal (detect.ts): are the days
 * of the CUSUM's run higher (or lower) than the baseline's days, judged by
 * ranks alone, so that a single extreme day weighs no more than any other?
 */

/** Largest smaller sample counted exactly (C(60, 12) ≈ 1.4·10¹² subsets still count exactly in doubles). */
export const EXACT_MAX = 12;

export interface RankSumResult {
  /** Mann–Whitney count for x (pairs x > y, ties ½). */
  w: number;
  m: number;
  n: number;
  /** P(W ≥ w) under H0: x tends to be larger. */
  pGreater: number;
  /** P(W ≤ w) under H0: x tends to be smaller. */
  pLess: number;
  exact: boolean;
}

/** Null when either sample is empty or a value is not finite. */
export function rankSum(x: readonly number[], y: readonly number[], exactMax = EXACT_MAX): RankSumResult | null {
  const m = x.length;
  const n = y.length;
  if (m === 0 || n === 0 || ![...x, ...y].every(Number.isFinite)) return null;
  const all = [...x.map((v) => ({ v, isX: true })), ...y.map((v) => ({ v, isX: false }))].sort((a, b) => a.v - b.v);
  // Doubled mid-ranks: a tie group over positions i..j (1-based) gets i + j each.
  const twice = new Array<number>(all.length);
  const tieSizes: number[] = [];
  for (let i = 0; i < all.length; ) {
    let j = i;
    while (j + 1 < all.length && all[j + 1]!.v === all[i]!.v) j++;
    for (let k = i; k <= j; k++) twice[k] = i + 1 + (j + 1);
    tieSizes.push(j - i + 1);
    i = j + 1;
  }
  const twiceSumX = all.reduce((s, a, i) => (a.isX ? s + twice[i]! : s), 0);
  const w = twiceSumX / 2 - (m * (m + 1)) / 2;

  if (Math.min(m, n) <= exactMax) {
    // The smaller sample's doubled rank sum over all subsets of its size; x's W read off it.
    const small = Math.min(m, n);
    const observed = m <= n ? twiceSumX : twice.reduce((s, r) => s + r, 0) - twiceSumX;
    const counts = subsetSumCounts(twice, small);
    let total = 0;
    let atLeast = 0;
    let atMost = 0;
    counts.forEach((c, s) => {
      if (!c) return;
      total += c;
      if (s >= observed) atLeast += c;
      if (s <= observed) atMost += c;
    });
    // When y is the smaller sample, a large y sum is a small x sum.
    const [pGreater, pLess] = m <= n ? [atLeast / total, atMost / total] : [atMost / total, atLeast / total];
    return { w, m, n, pGreater, pLess, exact: true };
  }

  const N = m + n;
  const mean = (m * n) / 2;
  const ties = tieSizes.reduce((s, t) => s + (t ** 3 - t), 0);
  const variance = ((m * n) / 12) * (N + 1 - ties / (N * (N - 1)));
  if (!(variance > 0)) return { w, m, n, pGreater: 1, pLess: 1, exact: false };
  const sd = Math.sqrt(variance);
  return { w, m, n, pGreater: normalUpperTail((w - mean - 0.5) / sd), pLess: normalUpperTail((mean - w - 0.5) / sd), exact: false };
}

/** counts[s] = how many subsets of `size` of `values` (non-negative integers) sum to s. */
function subsetSumCounts(values: readonly number[], size: number): number[] {
  const max = values.reduce((s, v) => s + v, 0);
  // rows[k][s]: subsets of k values seen so far summing to s (counts up to C(N, 12) stay exact in doubles).
  const rows = Array.from({ length: size + 1 }, () => new Float64Array(max + 1));
  rows[0]![0] = 1;
  for (const v of values) {
    for (let k = size; k >= 1; k--) {
      const to = rows[k]!;
      const from = rows[k - 1]!;
      for (let s = max; s >= v; s--) if (from[s - v]) to[s] = to[s]! + from[s - v]!;
    }
  }
  return Array.from(rows[size]!);
}
