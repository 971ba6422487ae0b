import type { StationRecord } from '../telemetry/schemas';
import { dpHours, isDpInterval } from './dpIntervals';
import { environmentFigures, type EnvironmentFigures } from './environment';
import { headingFigures, type HeadingFigures } from './heading';
import { addHistogram, emptyHistogram, histogramTotal, radialPercentiles, type RadialPercentiles } from './radialHistogram';
import { maxOf, mergeRms } from './rms';
import { withinPct } from './withinLimit';

/**
 * One vessel-day of `station` records → the day's station-keeping figures.
 * Source: docs spec metrics-v1 "Station-keeping accuracy": dp_hours over all
 * station intervals; every other figure over DP intervals (mode
 * auto_position) only; a day with no DP intervals has null accuracy figures,
 * never 0. Composes the single-formula modules beside this file.
 */
export interface StationDayFigures extends RadialPercentiles, HeadingFigures, EnvironmentFigures {
  dp_hours: number;
  dp_intervals: number;
  /** N: samples in the merged histogram. */
  samples: number;
  r_rms: number | null;
  r_max: number | null;
  /** within_pct per watch-circle limit (m), keyed by the limit. */
  within_pct: Map<number, number | null>;
}

export function stationDayFigures(records: readonly StationRecord[], limitsM: readonly number[] = []): StationDayFigures {
  const dp = records.filter(isDpInterval);
  const h = emptyHistogram();
  for (const r of dp) if (r.err?.hist) addHistogram(h, r.err.hist);
  return {
    dp_hours: dpHours(records),
    dp_intervals: dp.length,
    samples: histogramTotal(h),
    ...radialPercentiles(h),
    r_rms: mergeRms(dp.map((r) => ({ n: r.n, rms: r.err?.r_rms }))),
    r_max: maxOf(dp.map((r) => r.err?.r_max)),
    within_pct: new Map(limitsM.map((l) => [l, withinPct(h, l)])),
    ...headingFigures(dp),
    ...environmentFigures(dp),
  };
}
