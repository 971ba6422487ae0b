import { daysBetween } from '../time/dayRange';
import { addDays, fleetDay } from '../time/fleetDay';

/**
 * Fleet days on a chart's x axis. Every chart of daily figures has one point
 * per calendar day of its range, so a day without a stored row is a visible
 * gap (null), never a zero and never silently skipped. Days are fleet days
 * (FLEET_TIME_ZONE); the axis label says which zone.
 */

/** The longest range a page draws: a year, leap years included (as the API). */
export const MAX_CHART_DAYS = 366;

/** Every day from `from` to `to`, both included. */
export function chartDays(from: string, to: string): string[] {
  return daysBetween(from, to, MAX_CHART_DAYS);
}

/** Today in the fleet time zone and the `days` days ending on it. */
export function trailingRange(now: Date, timeZone: string, days: number): { from: string; to: string; today: string } {
  const today = fleetDay(now, timeZone);
  return { from: addDays(today, -(days - 1)), to: today, today };
}

/** One value per day of `days`: the row's figure, or null when the day has no row or no figure. */
export function valuesByDay<T extends { day: string }>(
  days: readonly string[],
  rows: readonly T[],
  pick: (row: T) => number | null | undefined,
): (number | null)[] {
  const byDay = new Map<string, T>();
  for (const r of rows) byDay.set(r.day, r);
  return days.map((d) => {
    const row = byDay.get(d);
    if (!row) return null;
    const v = pick(row);
    return v === null || v === undefined || !Number.isFinite(v) ? null : v;
  });
}

const MONTHS = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];

/** "2 Dec" for 2026-12-02: a calendar day, so no time zone is applied. */
export function shortDay(day: string): string {
  const month = Number(day.slice(5, 7));
  return `${Number(day.slice(8, 10))} ${MONTHS[month - 1] ?? '?'}`;
}

/** "2 Dec 2026". */
export function longDay(day: string): string {
  return `${shortDay(day)} ${day.slice(0, 4)}`;
}

/** The x-axis label of every daily chart. */
export function dayAxisLabel(timeZone: string): string {
  return `Fleet day (${timeZone})`;
}

/**
 * An instant as the fleet's wall-clock time, "2026-12-02 13:05", for times
 * the pages show beside fleet days (flag acknowledgements, last record).
 */
const instantFormatters = new Map<string, Intl.DateTimeFormat>();
export function fleetTime(instant: Date, timeZone: string): string {
  let f = instantFormatters.get(timeZone);
  if (!f) {
    f = new Intl.DateTimeFormat('en-CA', {
      timeZone,
      year: 'numeric',
      month: '2-digit',
      day: '2-digit',
      hour: '2-digit',
      minute: '2-digit',
      hourCycle: 'h23',
    });
    instantFormatters.set(timeZone, f);
  }
  const parts = Object.fromEntries(f.formatToParts(instant).map((p) => [p.type, p.value]));
  return `${parts.year}-${parts.month}-${parts.day} ${parts.hour}:${parts.minute}`;
}
