import { OVERFLOW_BIN, histogramTotal } from './radialHistogram';

const BINS_PER_M = 10; // 1 / BIN_WIDTH_M

/**
 * within_pct(L) = 100 · (count of samples below L) / N, where the bin that
 * contains L contributes the fraction of its width below L (linear).
 * Source: docs spec metrics-v1 "Station-keeping accuracy".
 *
 * With k = ⌊L / 0.1⌋ and f = L/0.1 − k (the fraction of bin k below L):
 *   within_pct(L) = 100 · (C_{k−1} + f · H_k) / N.
 *
 * Choices the spec leaves open (docs to mirror them):
 * - N = 0 → null (no samples is a gap, never 0).
 * - L ≥ 10 m: bins 0..99 are wholly below L; the overflow bin (≥ 10 m) has no
 *   upper edge, so none of it is counted. For L = 10 that is exact; for
 *   L > 10 the figure is a lower bound (samples between 10 m and L are not
 *   resolved by the contract).
 * - L must be finite and ≥ 0 (L = 0 gives 0).
 */
export function withinPct(h: ArrayLike<number>, limitM: number): number | null {
  if (!Number.isFinite(limitM) || limitM < 0) throw new RangeError(`limit must be a finite number ≥ 0, got ${limitM}`);
  const n = histogramTotal(h);
  if (n === 0) return null;
  // L·10 rather than L/0.1: 0.3/0.1 = 2.9999999999999996 but 0.3·10 = 3.
  const x = limitM * BINS_PER_M;
  const k = Math.floor(x);
  const last = Math.min(k, OVERFLOW_BIN, h.length);
  let below = 0;
  for (let i = 0; i < last; i++) below += h[i]!;
  if (k < OVERFLOW_BIN && k < h.length) below += (x - k) * h[k]!;
  return (100 * below) / n;
}

/** A limit in metres as a within_pct key (api-v1): as written in the register (3 → "3", 2.5 → "2.5"). */
export const limitKey = (limitM: number): string => String(limitM);
