/**
 * Reduce 1 Hz samples of one interval to the statistics of telemetry-v1:
 * radial error histogram (0.1 m bins, overflow bin 100 at ≥ 10 m), mean,
 * RMS and maximum; heading error mean, RMS and largest magnitude.
 */
import { BIN_WIDTH_M, HIST_BINS } from '../lib/metrics/radialHistogram';

export interface PositionErrorStats {
  north_mean: number;
  east_mean: number;
  r_mean: number;
  r_rms: number;
  r_max: number;
  hist: number[];
}

export function positionErrorStats(north: ArrayLike<number>, east: ArrayLike<number>): PositionErrorStats {
  const n = north.length;
  const hist = new Array<number>(HIST_BINS).fill(0);
  let sn = 0, se = 0, sr = 0, sr2 = 0, rmax = 0;
  for (let i = 0; i < n; i++) {
    const x = north[i]!, y = east[i]!;
    const r = Math.sqrt(x * x + y * y);
    sn += x;
    se += y;
    sr += r;
    sr2 += r * r;
    if (r > rmax) rmax = r;
    hist[Math.min(HIST_BINS - 1, Math.floor(r / BIN_WIDTH_M))]! += 1;
  }
  // Trailing zero bins may be omitted (contract); keep the payload small.
  let last = hist.length;
  while (last > 0 && hist[last - 1] === 0) last--;
  return {
    north_mean: round(sn / n, 3),
    east_mean: round(se / n, 3),
    r_mean: round(sr / n, 3),
    r_rms: round(Math.sqrt(sr2 / n), 3),
    r_max: round(rmax, 3),
    hist: hist.slice(0, last),
  };
}

export function headingErrorStats(errors: ArrayLike<number>): { mean: number; rms: number; max_abs: number } {
  let s = 0, s2 = 0, m = 0;
  for (let i = 0; i < errors.length; i++) {
    const e = errors[i]!;
    s += e;
    s2 += e * e;
    const a = e < 0 ? -e : e;
    if (a > m) m = a;
  }
  return { mean: round(s / errors.length, 3), rms: round(Math.sqrt(s2 / errors.length), 3), max_abs: round(m, 3) };
}

const POW10 = [1, 10, 100, 1000, 1e4, 1e5, 1e6, 1e7];

export function round(x: number, digits: number): number {
  const f = POW10[digits] ?? 10 ** digits;
  return Math.round(x * f) / f;
}
