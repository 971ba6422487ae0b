import type { StationRecord } from '../telemetry/schemas';
import { maxOf } from './rms';

/**
 * Environment of the day over DP intervals weighted by `dt`: mean wind, mean
 * current; max gust. Source: docs spec metrics-v1 "Station-keeping accuracy".
 * A mean uses only the intervals that sent the field (a failed sensor omits
 * it: telemetry-v1), weighted by their `dt`; none sent → null (never 0).
 * The caller passes DP intervals only (see dpIntervals.ts).
 */
export interface EnvironmentFigures {
  wind_ms_mean: number | null;
  current_ms_mean: number | null;
  wind_gust_ms_max: number | null;
}

function dtWeightedMean(rows: readonly { dt: number; v: number | undefined }[]): number | null {
  let sw = 0;
  let s = 0;
  for (const { dt, v } of rows) {
    if (v === undefined) continue;
    sw += dt;
    s += dt * v;
  }
  return sw > 0 ? s / sw : null;
}

export function environmentFigures(dpIntervals: readonly Pick<StationRecord, 'dt' | 'env'>[]): EnvironmentFigures {
  return {
    wind_ms_mean: dtWeightedMean(dpIntervals.map((r) => ({ dt: r.dt, v: r.env?.wind_ms }))),
    current_ms_mean: dtWeightedMean(dpIntervals.map((r) => ({ dt: r.dt, v: r.env?.current_ms }))),
    wind_gust_ms_max: maxOf(dpIntervals.map((r) => r.env?.wind_gust_ms)),
  };
}
