import { clipToScope, type DayRange, type Scope } from '../auth/scope';
import { MAX_CHART_DAYS } from '../charts/days';
import { addDays } from '../time/fleetDay';
import type { PageRange } from './dayRangeParams';

/**
 * Ranges of days a page reads, cut to what the reader may see. Page
 * queries read one contiguous range; a charterer's visible days of a
 * vessel can have gaps (two campaigns apart), so a page shows one visible
 * part at a time and never a range that spans days it may not see.
 */

/** The visible part of a flag's chart range that holds `anchor` (the window's first day); null when none. */
export function visibleChartRange(scope: Scope, vesselKey: string, range: DayRange, anchor: string): DayRange | null {
  return clipToScope(scope, vesselKey, range.from, range.to).find((p) => p.from <= anchor && anchor <= p.to) ?? null;
}

/**
 * The vessel page's range for the reader: as asked for the whole fleet;
 * for a charterer the latest visible part of it, or, when none of it is
 * visible, the last 30 days (at most) of the latest visible window up to
 * today. null when the vessel has no visible day up to today.
 */
export function visiblePageRange(scope: Scope, vesselKey: string, range: PageRange, today: string): PageRange | null {
  if (scope.kind === 'fleet') return range;
  const asked = clipToScope(scope, vesselKey, range.from, range.to).at(-1);
  if (asked) return asked.from === range.from && asked.to === range.to ? range : asPageRange(asked, 'Only the days of your campaigns are shown.');
  const latest = clipToScope(scope, vesselKey, '0001-01-01', today).at(-1);
  if (!latest) return null;
  const from = addDays(latest.to, -29) > latest.from ? addDays(latest.to, -29) : latest.from;
  return asPageRange({ from, to: latest.to }, 'The dates asked for are outside your campaigns; showing the latest days of them.');
}

function asPageRange(r: DayRange, problem: string): PageRange {
  const days = Math.round((Date.parse(`${r.to}T00:00:00Z`) - Date.parse(`${r.from}T00:00:00Z`)) / 86_400_000) + 1;
  return { from: r.from, to: r.to, days: Math.min(days, MAX_CHART_DAYS), preset: null, problem };
}
