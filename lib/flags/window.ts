import { addDays } from '../time/fleetDay';
import type { FlagSettings } from './config';

/**
 * Which days the flag job looks at when it evaluates a day D:
 *   window   [D − windowDays + 1, D]                     the trend test
 *   baseline [D − windowDays − baselineDays + 1, D − windowDays]   the EWMA target and spread
 * A day without a figure is simply absent (a gap), never a zero.
 */

export interface DayValue {
  day: string;
  value: number;
}

export interface Ranges {
  window: { from: string; to: string };
  baseline: { from: string; to: string };
}

export function rangesFor(day: string, s: Pick<FlagSettings, 'windowDays' | 'baselineDays'>): Ranges {
  const from = addDays(day, -(s.windowDays - 1));
  return {
    window: { from, to: day },
    baseline: { from: addDays(from, -s.baselineDays), to: addDays(from, -1) },
  };
}

/** Days since 1970-01-01: time in days for Sen's slope, so gaps keep their length. */
export function dayNumber(day: string): number {
  return Date.parse(`${day}T00:00:00Z`) / 86_400_000;
}

/** The finite values of `series` (sorted by day) with from ≤ day ≤ to. */
export function within(series: readonly DayValue[], from: string, to: string): DayValue[] {
  return series.filter((d) => d.day >= from && d.day <= to && Number.isFinite(d.value));
}
