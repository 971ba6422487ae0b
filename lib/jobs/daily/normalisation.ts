import { baselineWindow, BASELINE_DAYS, BASELINE_LAG_DAYS, fitNormalisation, p95Norm, type WeatherDay } from '../../metrics/normalisedAccuracy';
import { addDays } from '../../time/fleetDay';

/**
 * p95_norm for a vessel's days (lib/metrics/normalisedAccuracy.ts has the
 * method and its sources). A day's baseline is [day − 119, day − 30], so a
 * recomputed day D changes p95_norm of D itself and of every day whose
 * baseline holds D: D + 30 … D + 119. `affectedRange` says which days to
 * re-evaluate and which stored days to read; `normalisedDays` evaluates them.
 * Pure: no I/O.
 */

export interface StoredDay {
  day: string;
  p95_m: number | null;
  p95_overflow: boolean | null;
  wind_mean_ms: number | null;
  current_mean_ms: number | null;
}

export interface AffectedRange {
  /** Days to re-evaluate: from the first changed day to the last day whose baseline holds a changed day. */
  evaluateFrom: string;
  evaluateTo: string;
  /** Stored days to read: every baseline of the evaluated days. */
  readFrom: string;
}

export function affectedRange(changedFrom: string, changedTo: string): AffectedRange {
  return {
    evaluateFrom: changedFrom,
    evaluateTo: addDays(changedTo, BASELINE_LAG_DAYS + BASELINE_DAYS - 1),
    readFrom: baselineWindow(changedFrom).from,
  };
}

/** A baseline day: a p95 that was measured (not censored at ≥ 10 m) with its weather. */
const usable = (d: StoredDay): boolean => d.p95_m !== null && d.p95_overflow !== true && d.wind_mean_ms !== null;

/**
 * p95_norm of each stored day in [from, to], from the stored days around it.
 * `days` sorted by day. Windows slide one day at a time, so the baseline is
 * kept as a running slice of the sorted list rather than refiltered.
 */
export function normalisedDays(days: readonly StoredDay[], from: string, to: string): Map<string, number | null> {
  const out = new Map<string, number | null>();
  let lo = 0;
  let hi = 0;
  for (const d of days) {
    if (d.day < from || d.day > to) continue;
    const w = baselineWindow(d.day);
    while (lo < days.length && days[lo]!.day < w.from) lo++;
    while (hi < days.length && days[hi]!.day <= w.to) hi++;
    const baseline: WeatherDay[] = [];
    for (let i = lo; i < hi; i++) {
      const b = days[i]!;
      if (usable(b)) baseline.push({ p95: b.p95_m!, wind_ms: b.wind_mean_ms, current_ms: b.current_mean_ms });
    }
    const model = fitNormalisation(baseline);
    out.set(d.day, p95Norm(model, { p95: d.p95_m, wind_ms: d.wind_mean_ms, current_ms: d.current_mean_ms }));
  }
  return out;
}
