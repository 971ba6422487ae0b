/**
 * The one-sided tabular CUSUM (decision-interval scheme) of E. S. Page,
 * "Continuous inspection schemes", Biometrika 41 (1954) 100–115, in the form
 * the NIST/SEMATECH e-Handbook of Statistical Methods §6.3.2.3 and D. C.
 * Montgomery and G. C. Runger, Applied Statistics and Probability for
 * Engineers, 3rd ed. (Wiley 2003), §16-8 give it:
 *
 *   upper  C_t = max(0, x_t − (μ0 + K) + C_{t−1})     C_0 = 0
 *   lower  C_t = max(0, (μ0 − K) − x_t + C_{t−1})
 *
 * with reference value K (half the shift worth detecting, often σ/2) and
 * decision interval H (often 4σ–5σ); the chart signals when C_t > H. N_t
 * counts the consecutive periods C has been above zero: the run started
 * N_t periods ago, so the shift began about then, and the mean since then
 * is estimated as μ0 ± (K + C_t/N_t) (Montgomery, Introduction to
 * Statistical Quality Control, §9.1.2 — from memory).
 *
 * Accumulating every excess over μ0 + K, it answers a lasting shift sooner
 * than an EWMA whose size must first reach a limit; the flag job uses it as
 * the first signal (lib/flags/detect.ts).
 */

export type CusumSide = 'upper' | 'lower';

export interface CusumPoint {
  /** 1-based position in the monitored series. */
  t: number;
  value: number;
  /** The one-sided cumulative sum after this point (≥ 0), in the data's unit. */
  c: number;
  /** Consecutive points, up to this one, with c > 0 (0 when c = 0). */
  n: number;
  /** c > H. */
  signal: boolean;
}

export interface CusumOptions {
  side: CusumSide;
  /** In-control mean μ0. */
  target: number;
  /** Reference value K (slack), in the data's unit, ≥ 0. */
  k: number;
  /** Decision interval H, in the data's unit, > 0. */
  h: number;
}

export function cusumChart(values: readonly number[], o: CusumOptions): CusumPoint[] {
  if (!(o.k >= 0) || !(o.h > 0)) throw new RangeError(`cusum: need K ≥ 0 and H > 0, got K = ${o.k}, H = ${o.h}`);
  const sign = o.side === 'upper' ? 1 : -1;
  let c = 0;
  let n = 0;
  return values.map((value, i) => {
    c = Math.max(0, sign * (value - o.target) - o.k + c);
    n = c > 0 ? n + 1 : 0;
    return { t: i + 1, value, c, n, signal: c > o.h };
  });
}

/** The mean since the run began, μ0 ± (K + C/N), or null while C = 0 (Montgomery §9.1.2, from memory). */
export function shiftedMean(p: Pick<CusumPoint, 'c' | 'n'>, o: Pick<CusumOptions, 'side' | 'target' | 'k'>): number | null {
  if (p.n === 0) return null;
  const sign = o.side === 'upper' ? 1 : -1;
  return o.target + sign * (o.k + p.c / p.n);
}
