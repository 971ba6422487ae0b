import { addDays } from '../time/fleetDay';
import { isDay } from '../time/dayRange';
import { MAX_CHART_DAYS } from '../charts/days';
import { param, type RawSearchParams } from './searchParams';

/**
 * The vessel page's date range from its URL: `from` and `to` fleet days
 * (inclusive), or a preset `days` (7, 30, 90, 365) ending today. Defaults to
 * the last 30 days. A range the page cannot draw (unreadable days, from
 * after to, more than a year) falls back to the default and says why, so a
 * mistyped date never ends in an error page.
 */
export const RANGE_PRESETS = [7, 30, 90, 365] as const;
export const DEFAULT_RANGE_DAYS = 30;

export interface PageRange {
  from: string;
  to: string;
  days: number;
  /** The preset this range is, if any (for the picker). */
  preset: number | null;
  /** Why the asked-for range was not used; null when it was. */
  problem: string | null;
}

const span = (from: string, to: string) => Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000) + 1;

function preset(days: number, today: string, problem: string | null = null): PageRange {
  return { from: addDays(today, -(days - 1)), to: today, days, preset: days, problem };
}

export function parsePageRange(params: RawSearchParams, today: string): PageRange {
  const from = param(params, 'from');
  const to = param(params, 'to');
  const days = Number(param(params, 'days'));
  if (from === undefined && to === undefined) {
    return preset((RANGE_PRESETS as readonly number[]).includes(days) ? days : DEFAULT_RANGE_DAYS, today);
  }
  const end = to ?? today;
  const start = from ?? addDays(end, -(DEFAULT_RANGE_DAYS - 1));
  if (!isDay(start) || !isDay(end)) return preset(DEFAULT_RANGE_DAYS, today, 'The dates could not be read (write them YYYY-MM-DD); showing the last 30 days.');
  if (start > end) return preset(DEFAULT_RANGE_DAYS, today, `${start} is after ${end}; showing the last 30 days.`);
  const n = span(start, end);
  if (n > MAX_CHART_DAYS) return preset(DEFAULT_RANGE_DAYS, today, `${n} days is more than a page draws (at most ${MAX_CHART_DAYS}); showing the last 30 days.`);
  const isPreset = end === today && (RANGE_PRESETS as readonly number[]).includes(n) ? n : null;
  return { from: start, to: end, days: n, preset: isPreset, problem: null };
}
