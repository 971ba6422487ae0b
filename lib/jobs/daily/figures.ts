import { limitEventsPerDpDay } from '../../metrics/powerLimit';
import { emptyHistogram, histogramTotal, radialPercentiles } from '../../metrics/radialHistogram';
import { maxOf, mergeRms } from '../../metrics/rms';
import { DEFAULT_LIFE_EXPONENT, wearHoursOfBands } from '../../metrics/wear';
import { limitKey, withinPct } from '../../metrics/withinLimit';
import type { BusAggregate, RefAggregate, StationAggregate, ThrusterAggregate } from './aggregateSql';
import { addHistogramText } from './histogramText';

/**
 * Daily rows from the per-vessel-day sums of aggregateSql.ts, finished with
 * the formulas of lib/metrics (source: spec metrics-v1). Pure: no I/O.
 * Each sum arrives already reduced, so a formula that merges parts (RMS, a
 * dt-weighted mean) is given one part carrying the whole day.
 */

export interface DailyVesselRow {
  vessel_id: number;
  day: string;
  station_records: number;
  dp_intervals: number;
  dp_hours: number | null;
  samples: number;
  err_hist: number[] | null;
  p50_m: number | null;
  p95_m: number | null;
  p99_m: number | null;
  p95_overflow: boolean | null;
  r_rms_m: number | null;
  r_max_m: number | null;
  within_pct: Record<string, number | null>;
  hdg_rms_deg: number | null;
  hdg_max_abs_deg: number | null;
  wind_mean_ms: number | null;
  /** Mean |sin(wind from − heading set point)| over DP intervals with both, weighted by dt (0 bow or stern, 1 beam). */
  wind_beam_share: number | null;
  gust_max_ms: number | null;
  current_mean_ms: number | null;
  limit_events: number | null;
  limit_seconds: number | null;
  limit_events_per_dp_day: number | null;
  blackouts: number | null;
  peak_load_ratio: number | null;
}

export interface DailyThrusterRow {
  vessel_id: number;
  unit_id: string;
  day: string;
  run_hours: number;
  starts: number;
  azimuth_travel_deg: number | null;
  wear_hours: number | null;
  unbanded_run_s: number;
  efficiency_index: number | null;
}

/** A bus's day is its sums as they come (metrics-v1 "Power limit", per bus). */
export type DailyBusRow = BusAggregate;

export interface DailyRefRow {
  vessel_id: number;
  unit_id: string;
  day: string;
  kind: string | null;
  online_hours: number | null;
  weight_mean: number | null;
  sd_m_median: number | null;
  rejections: number | null;
}

/** Σ over parts that sent the field; null when none did (sums of metrics-v1 skip missing values). */
function sumSent(values: readonly (number | null)[]): number | null {
  let s: number | null = null;
  for (const v of values) if (v !== null) s = (s ?? 0) + v;
  return s;
}

/** One part that carries the whole day: Σ n·rms² and Σ n back into (n, rms). */
const dayRms = (ss: number | null, n: number | null): number | null =>
  n === null || ss === null ? null : mergeRms([{ n, rms: n > 0 ? Math.sqrt(ss / n) : null }]);

const ratio = (sum: number | null, weight: number | null): number | null =>
  sum === null || weight === null || !(weight > 0) ? null : sum / weight;

/**
 * The vessel's row for one day. `station` is missing when no station record
 * arrived (dp_hours null: no data is not 0 h); `buses` are that day's bus
 * rows (power figures null when none arrived).
 */
export function vesselDayRow(
  key: { vessel_id: number; day: string },
  station: StationAggregate | undefined,
  buses: readonly BusAggregate[],
  watchCirclesM: readonly number[],
): DailyVesselRow {
  const h = emptyHistogram();
  if (station?.hist_text) addHistogramText(h, station.hist_text);
  const n = histogramTotal(h);
  const { p50, p95, p99 } = radialPercentiles(h);
  const dpHours = station ? station.dp_hours : null;
  const limitEvents = buses.length ? sumSent(buses.map((b) => b.limit_events)) : null;
  return {
    ...key,
    station_records: station?.station_records ?? 0,
    dp_intervals: station?.dp_intervals ?? 0,
    dp_hours: dpHours,
    samples: n,
    err_hist: n > 0 ? trimTrailingZeros(h) : null,
    p50_m: p50?.m ?? null,
    p95_m: p95?.m ?? null,
    p99_m: p99?.m ?? null,
    p95_overflow: p95 ? p95.overflow : null,
    r_rms_m: station ? dayRms(station.r_ss, station.r_n) : null,
    r_max_m: station?.r_max ?? null,
    within_pct: Object.fromEntries(watchCirclesM.map((l) => [limitKey(l), withinPct(h, l)])),
    hdg_rms_deg: station ? dayRms(station.h_ss, station.h_n) : null,
    hdg_max_abs_deg: station?.h_max_abs ?? null,
    wind_mean_ms: station ? ratio(station.wind_sum, station.wind_dt) : null,
    wind_beam_share: station ? ratio(station.beam_sum, station.beam_dt) : null,
    gust_max_ms: station?.gust_max ?? null,
    current_mean_ms: station ? ratio(station.current_sum, station.current_dt) : null,
    limit_events: limitEvents,
    limit_seconds: buses.length ? sumSent(buses.map((b) => b.limit_seconds)) : null,
    limit_events_per_dp_day: limitEvents !== null && dpHours !== null ? limitEventsPerDpDay(limitEvents, dpHours) : null,
    blackouts: buses.length ? buses.reduce((s, b) => s + b.blackouts, 0) : null,
    peak_load_ratio: maxOf(buses.map((b) => b.peak_load_ratio)),
  };
}

function trimTrailingZeros(h: Float64Array): number[] {
  let end = h.length;
  while (end > 0 && h[end - 1] === 0) end--;
  return Array.from(h.subarray(0, end));
}

/** A thruster's day; `lifeExponent` from the register (default 3, ISO 281 ball bearings). */
export function thrusterDayRow(a: ThrusterAggregate, lifeExponent = DEFAULT_LIFE_EXPONENT): DailyThrusterRow {
  return {
    vessel_id: a.vessel_id,
    unit_id: a.unit_id,
    day: a.day,
    run_hours: a.run_hours,
    starts: a.starts,
    azimuth_travel_deg: a.azimuth_travel_deg,
    // Wear is linear in band seconds, so the bands summed over the day give
    // the sum of the intervals' wear (lib/metrics/wear.ts sumWearHours).
    wear_hours: a.wear_known > 0 ? wearHoursOfBands(a.band_s, { p: lifeExponent }) : null,
    unbanded_run_s: a.unbanded_run_s,
    // metrics-v1: Σ(thrust·run_s) / Σ(power^(2/3)·run_s) over qualifying intervals.
    efficiency_index: a.eff_n > 0 && a.eff_num !== null && a.eff_den !== null && a.eff_den > 0 ? a.eff_num / a.eff_den : null,
  };
}

export function refDayRow(a: RefAggregate): DailyRefRow {
  return {
    vessel_id: a.vessel_id,
    unit_id: a.unit_id,
    day: a.day,
    kind: a.kind,
    online_hours: a.online_hours,
    weight_mean: ratio(a.weight_sum, a.weight_online_s),
    sd_m_median: a.sd_m_median,
    rejections: a.rejections,
  };
}
