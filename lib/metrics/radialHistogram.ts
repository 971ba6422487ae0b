/**
 * Radial error histograms of the DP intervals: merging and quantiles.
 *
 * Source: docs spec metrics-v1 "Station-keeping accuracy" (H is the
 * element-wise sum of the DP intervals' `err.hist`, N = Σ H; the q-quantile
 * lies in the first bin k whose cumulative count C_k reaches q·N, at
 * 0.1·k + 0.1·(q·N − C_{k−1}) / H_k metres; a quantile in the overflow bin is
 * reported as 10 and shown as "≥ 10 m") and telemetry-v1 `err.hist` (bin k,
 * k < 100, holds [0.1·k, 0.1·(k+1)) m, bin 100 holds ≥ 10 m, trailing zero
 * bins may be omitted).
 *
 * Sums are kept in a Float64Array: counts are integers and a double holds
 * every integer up to 2^53 exactly, so merging is exact (an Int32Array would
 * overflow after about 2.1·10^9 samples — 68 years of 1 Hz data, but a fleet
 * total could reach it).
 */

/** Bins 0..99 of 0.1 m, plus the overflow bin 100 (≥ 10 m). */
export const HIST_BINS = 101;
export const OVERFLOW_BIN = 100;
export const BIN_WIDTH_M = 0.1;
/** The value reported for a quantile that falls in the overflow bin. */
export const OVERFLOW_M = 10;

export type RadialHistogram = Float64Array;

export function emptyHistogram(): RadialHistogram {
  return new Float64Array(HIST_BINS);
}

/** Adds one interval's `err.hist` (≤ 101 counts) into `acc`, in place. */
export function addHistogram(acc: RadialHistogram, hist: ArrayLike<number>): RadialHistogram {
  if (hist.length > HIST_BINS) throw new RangeError(`histogram has ${hist.length} bins, at most ${HIST_BINS}`);
  for (let k = 0; k < hist.length; k++) acc[k]! += hist[k]!;
  return acc;
}

/** H: the element-wise sum of many histograms. */
export function mergeHistograms(hists: Iterable<ArrayLike<number>>): RadialHistogram {
  const acc = emptyHistogram();
  for (const h of hists) addHistogram(acc, h);
  return acc;
}

export function histogramTotal(h: ArrayLike<number>): number {
  let n = 0;
  for (let k = 0; k < h.length; k++) n += h[k]!;
  return n;
}

export interface RadialQuantile {
  /** Metres; 10 when the quantile falls in the overflow bin. */
  m: number;
  /** True when the quantile is in the overflow bin: show as "≥ 10 m". */
  overflow: boolean;
}

/**
 * The q-quantile (0 < q ≤ 1) of H by the spec's in-bin linear interpolation;
 * null when N = 0 (no samples: a gap, never 0).
 * q = 0 is refused: every bin has C_k ≥ 0, so "the first bin reaching q·N"
 * would be bin 0 even when it is empty (H_0 = 0, division by zero).
 */
export function radialQuantile(h: ArrayLike<number>, q: number): RadialQuantile | null {
  if (!(q > 0 && q <= 1)) throw new RangeError(`quantile must be in (0, 1], got ${q}`);
  const n = histogramTotal(h);
  if (n === 0) return null;
  const target = q * n;
  let before = 0; // C_{k−1}
  for (let k = 0; k < h.length; k++) {
    const hk = h[k]!;
    const ck = before + hk;
    // C_{k−1} < q·N ≤ C_k implies H_k > 0, so the division is safe.
    if (ck >= target && hk > 0) {
      if (k >= OVERFLOW_BIN) return { m: OVERFLOW_M, overflow: true };
      return { m: BIN_WIDTH_M * k + (BIN_WIDTH_M * (target - before)) / hk, overflow: false };
    }
    before = ck;
  }
  // Unreachable for q ≤ 1 (C_last = N ≥ q·N); kept for rounding safety.
  return { m: OVERFLOW_M, overflow: true };
}

export interface RadialPercentiles {
  p50: RadialQuantile | null;
  p95: RadialQuantile | null;
  p99: RadialQuantile | null;
}

export function radialPercentiles(h: ArrayLike<number>): RadialPercentiles {
  return { p50: radialQuantile(h, 0.5), p95: radialQuantile(h, 0.95), p99: radialQuantile(h, 0.99) };
}
