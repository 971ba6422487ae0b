import { addDays } from '../time/fleetDay';

/**
 * Wear hours to service and the projected service date.
 * Source: docs spec metrics-v1 "Thruster wear": cumulative wear_hours since
 * the last overhaul, against a service interval set per thruster, gives
 * wear_hours_to_service and, from the trailing 30-day rate, a projected
 * service date.
 *
 * Choices the spec leaves open (docs to mirror them):
 * - wear_hours_to_service = interval − cumulative; negative means overdue
 *   (kept, not clamped, so the UI can say by how much).
 * - The trailing rate is the mean daily wear over the days of the 30-day
 *   window ending on `asOf` that have a figure (a day without data is a gap,
 *   not zero wear). Days outside the window are ignored.
 * - Rate 0 or no day with data → no projection (null), never "infinitely far".
 * - Projected date: the day on which cumulative wear reaches the interval at
 *   that rate, asOf + ⌈to_service / rate⌉ days; asOf itself when already due.
 * - A date more than HORIZON_DAYS ahead is null: at a near-zero rate it could
 *   fall centuries ahead (past year 9999, which YYYY-MM-DD cannot write) and
 *   says nothing a planner could use.
 */
export const TRAILING_DAYS = 30;
export const HORIZON_DAYS = 36_525; // 100 years

export interface DailyWear {
  day: string; // YYYY-MM-DD
  wear_hours: number | null;
}

export interface ServiceProjection {
  wear_hours_to_service: number;
  /** Wear hours per day over the trailing window; null when no day has data. */
  rate_per_day: number | null;
  days_with_data: number;
  projected_service_day: string | null;
}

export function trailingWearRate(days: readonly DailyWear[], asOf: string, windowDays = TRAILING_DAYS): { rate: number | null; days: number } {
  const first = addDays(asOf, -(windowDays - 1));
  let sum = 0;
  let count = 0;
  for (const d of days) {
    if (d.day < first || d.day > asOf || d.wear_hours === null) continue;
    sum += d.wear_hours;
    count++;
  }
  return { rate: count > 0 ? sum / count : null, days: count };
}

export function projectService(input: {
  cumulativeWearHours: number;
  serviceIntervalWearHours: number;
  daily: readonly DailyWear[];
  asOf: string;
}): ServiceProjection {
  const toService = input.serviceIntervalWearHours - input.cumulativeWearHours;
  const { rate, days } = trailingWearRate(input.daily, input.asOf);
  let projected: string | null = null;
  if (toService <= 0) projected = input.asOf;
  else if (rate !== null && rate > 0 && toService / rate <= HORIZON_DAYS) projected = addDays(input.asOf, Math.ceil(toService / rate));
  return { wear_hours_to_service: toService, rate_per_day: rate, days_with_data: days, projected_service_day: projected };
}
