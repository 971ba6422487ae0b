/**
 * Merging per-interval RMS values into a day's RMS, and the largest value.
 * Source: docs spec metrics-v1: r_rms = sqrt(Σ n·r_rms² / Σ n) and
 * r_max = max r_max (the same for heading: hdg_rms, hdg_max_abs). This is
 * exact: n·rms² is the interval's sum of squares.
 */

export interface RmsPart {
  /** Samples behind the RMS (telemetry-v1 `n`). */
  n: number;
  /** The interval's RMS; undefined/null when not sent (skipped, never read as 0). */
  rms: number | null | undefined;
}

/** sqrt(Σ n·rms² / Σ n) over parts that carry an RMS; null when Σ n = 0. */
export function mergeRms(parts: Iterable<RmsPart>): number | null {
  let ss = 0;
  let n = 0;
  for (const p of parts) {
    if (p.rms === null || p.rms === undefined || !(p.n > 0)) continue;
    ss += p.n * p.rms * p.rms;
    n += p.n;
  }
  return n > 0 ? Math.sqrt(ss / n) : null;
}

/** The largest value sent; null when none was sent. */
export function maxOf(values: Iterable<number | null | undefined>): number | null {
  let max: number | null = null;
  for (const v of values) {
    if (v === null || v === undefined) continue;
    if (max === null || v > max) max = v;
  }
  return max;
}
