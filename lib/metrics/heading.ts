import type { StationRecord } from '../telemetry/schemas';
import { maxOf, mergeRms } from './rms';

/**
 * Heading figures of a day over its DP intervals.
 * Source: docs spec metrics-v1: hdg_rms = sqrt(Σ n·rms² / Σ n),
 * hdg_max_abs = max. Intervals that do not send `hdg_err.rms` / `max_abs`
 * are skipped; no interval with a value → null (never 0).
 * The caller passes DP intervals only (see dpIntervals.ts).
 */
export interface HeadingFigures {
  hdg_rms: number | null;
  hdg_max_abs: number | null;
}

export function headingFigures(dpIntervals: readonly Pick<StationRecord, 'n' | 'hdg_err'>[]): HeadingFigures {
  return {
    hdg_rms: mergeRms(dpIntervals.map((r) => ({ n: r.n, rms: r.hdg_err?.rms }))),
    hdg_max_abs: maxOf(dpIntervals.map((r) => r.hdg_err?.max_abs)),
  };
}
