import type { MetricInfo } from '../web/flagMetrics';
import { addDays } from '../time/fleetDay';
import { dailyChart } from './dailyChart';
import { MAX_CHART_DAYS } from './days';
import type { DailyChartData } from './types';
import { axisLabel } from './units';

/**
 * A flag's chart: the watched series around the flag's window, with the
 * window marked. The range starts two weeks before the window (what
 * "before" looked like) and runs to today, but never more than
 * MAX_FLAG_CHART_DAYS, so an old flag still shows its window.
 */

export const LEAD_DAYS = 14;
export const MAX_FLAG_CHART_DAYS = 120;

export function flagChartRange(windowFrom: string, windowTo: string, today: string): { from: string; to: string } {
  const from = addDays(windowFrom, -LEAD_DAYS);
  const latest = addDays(from, MAX_FLAG_CHART_DAYS - 1);
  let to = today < windowTo ? windowTo : today;
  if (to > latest) to = latest < windowTo ? windowTo : latest;
  // A window longer than a chart can hold (not expected: windows are weeks) keeps its end.
  if (addDays(from, MAX_CHART_DAYS - 1) < to) return { from: addDays(to, -(MAX_CHART_DAYS - 1)), to };
  return { from, to };
}

export interface FlagSeriesRow {
  day: string;
  value: number | null;
}

export function flagChart(input: {
  id: string;
  metric: MetricInfo;
  subjectLabel: string;
  windowFrom: string;
  windowTo: string;
  range: { from: string; to: string };
  timeZone: string;
  rows: readonly FlagSeriesRow[];
}): DailyChartData {
  return dailyChart({
    id: input.id,
    title: `${input.metric.label}, ${input.subjectLabel}`,
    timeZone: input.timeZone,
    from: input.range.from,
    to: input.range.to,
    rows: input.rows,
    series: [{ key: 'value', label: input.metric.label, kind: 'line', tone: 'primary', unit: input.metric.unit, pick: (r) => r.value }],
    leftLabel: axisLabel(input.metric.quantity, input.metric.unit),
    bands: [{ from: input.windowFrom, to: input.windowTo, label: 'Flag window' }],
    about: `${input.metric.definition} Shaded: the days the flag's test looked at (${input.windowFrom} to ${input.windowTo}).`,
  });
}
