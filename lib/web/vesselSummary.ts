import type { RefDayItem } from '../api/queries/refDaily';
import type { ThrusterDayItem } from '../api/queries/thrusterDaily';
import type { ThrusterServiceItem } from '../api/queries/thrusterService';
import type { VesselDayItem } from '../api/queries/vesselDaily';
import { radialQuantile, type RadialQuantile } from '../metrics/radialHistogram';
import { median } from '../metrics/refs';
import { withinPct } from '../metrics/withinLimit';
import { compareNatural } from './collate';

/**
 * Figures over the vessel page's whole range. Percentiles and "inside"
 * shares come from the range's merged histogram (never averaged from daily
 * figures); sums add the days that have a figure and are null when none
 * has (no data is not zero).
 */

function sum(values: readonly (number | null)[]): number | null {
  let s: number | null = null;
  for (const v of values) if (v !== null) s = (s ?? 0) + v;
  return s;
}

function max(values: readonly (number | null)[]): number | null {
  let m: number | null = null;
  for (const v of values) if (v !== null && (m === null || v > m)) m = v;
  return m;
}

export interface RangeSummary {
  daysWithFigures: number;
  dpHours: number | null;
  p50: RadialQuantile | null;
  p95: RadialQuantile | null;
  within: { limit: number; pct: number | null }[];
  p95NormMedian: number | null;
  limitEvents: number | null;
  limitEventsPerDpDay: number | null;
  blackouts: number | null;
  peakLoadRatio: number | null;
}

export function rangeSummary(days: readonly VesselDayItem[], hist: ArrayLike<number>, watchCirclesM: readonly number[]): RangeSummary {
  const dpHours = sum(days.map((d) => d.dp_hours));
  const limitEvents = sum(days.map((d) => d.limit_events));
  return {
    daysWithFigures: days.length,
    dpHours,
    p50: radialQuantile(hist, 0.5),
    p95: radialQuantile(hist, 0.95),
    within: watchCirclesM.map((limit) => ({ limit, pct: withinPct(hist, limit) })),
    p95NormMedian: median(days.flatMap((d) => (d.p95_norm === null ? [] : [d.p95_norm]))),
    limitEvents,
    // Same rule as the daily figure (metrics-v1): per 24 DP hours, undefined without DP time.
    limitEventsPerDpDay: limitEvents !== null && dpHours !== null && dpHours > 0 ? (limitEvents * 24) / dpHours : null,
    blackouts: sum(days.map((d) => d.blackouts)),
    peakLoadRatio: max(days.map((d) => d.peak_load_ratio)),
  };
}

export interface ThrusterRow {
  id: string;
  kind: string | null;
  /** In the register; false for a unit that only appears in telemetry. */
  registered: boolean;
  runHours: number | null;
  wearHours: number | null;
  starts: number | null;
  latestEfficiency: { day: string; value: number } | null;
  serviceIntervalH: number | null;
  wearTotalH: number | null;
  toServiceH: number | null;
  projectedServiceDay: string | null;
  /** Share of the service interval used, 0..1+ (over 1: overdue). */
  used: number | null;
}

export function thrusterRows(
  registered: readonly { id: string; kind: string; serviceIntervalH: number }[],
  service: readonly ThrusterServiceItem[],
  days: readonly ThrusterDayItem[],
): ThrusterRow[] {
  const ids = [...new Set([...registered.map((t) => t.id), ...days.map((d) => d.thruster)])].sort(compareNatural);
  return ids.map((id) => {
    const reg = registered.find((t) => t.id === id);
    const svc = service.find((s) => s.id === id);
    const mine = days.filter((d) => d.thruster === id);
    const latest = [...mine].reverse().find((d) => d.efficiency_index !== null);
    const interval = reg?.serviceIntervalH ?? null;
    return {
      id,
      kind: reg?.kind ?? null,
      registered: Boolean(reg),
      runHours: sum(mine.map((d) => d.run_hours)),
      wearHours: sum(mine.map((d) => d.wear_hours)),
      starts: sum(mine.map((d) => d.starts)),
      latestEfficiency: latest ? { day: latest.day, value: latest.efficiency_index! } : null,
      serviceIntervalH: interval,
      wearTotalH: svc?.wear_hours_total ?? null,
      toServiceH: svc?.wear_hours_to_service ?? null,
      projectedServiceDay: svc?.projected_service_day ?? null,
      used: svc && interval ? svc.wear_hours_total / interval : null,
    };
  });
}

export interface RefRow {
  id: string;
  kind: string | null;
  onlineHours: number | null;
  /** Mean weight over the range, weighted by each day's online hours. */
  weightMean: number | null;
  sdMedian: number | null;
  rejections: number | null;
}

export function refRows(registered: readonly { id: string; kind: string }[], days: readonly RefDayItem[]): RefRow[] {
  const ids = [...new Set([...registered.map((r) => r.id), ...days.map((d) => d.ref)])].sort(compareNatural);
  return ids.map((id) => {
    const mine = days.filter((d) => d.ref === id);
    let w = 0;
    let wx = 0;
    for (const d of mine) {
      if (d.weight_mean === null || d.online_hours === null || d.online_hours <= 0) continue;
      w += d.online_hours;
      wx += d.online_hours * d.weight_mean;
    }
    return {
      id,
      kind: registered.find((r) => r.id === id)?.kind ?? null,
      onlineHours: sum(mine.map((d) => d.online_hours)),
      weightMean: w > 0 ? wx / w : null,
      sdMedian: median(mine.flatMap((d) => (d.sd_m_median === null ? [] : [d.sd_m_median]))),
      rejections: sum(mine.map((d) => d.rejections)),
    };
  });
}
