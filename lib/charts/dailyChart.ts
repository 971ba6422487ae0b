import { compareNatural } from '../web/collate';
import { chartDays, dayAxisLabel } from './days';
import { zeroBasedDomain } from './scale';
import type { BandSpec, DailyChartData, DailyRow, ReferenceLineSpec, SeriesSpec } from './types';

/**
 * Rows of a daily table → one chart: a row per calendar day of the range
 * (gaps are null), the series' values picked from the rows, the value axes
 * sized to hold every value and reference line.
 */

export interface DailySeriesInput<T> extends SeriesSpec {
  /** The figure of a row; null/undefined/non-finite is a gap. */
  pick: (row: T) => number | null | undefined;
}

export interface DailyChartInput<T extends { day: string }> {
  id: string;
  title: string;
  timeZone: string;
  from: string;
  to: string;
  rows: readonly T[];
  series: readonly DailySeriesInput<T>[];
  leftLabel: string;
  rightLabel?: string;
  refLines?: readonly ReferenceLineSpec[];
  bands?: readonly BandSpec[];
  /** What the figure is; the gap count is added to it. */
  about: string;
}

export function gapNote(days: number, daysWithData: number): string {
  if (daysWithData === 0) return `No figures on any of the ${days} days.`;
  const gaps = days - daysWithData;
  if (gaps === 0) return `Figures on all ${days} days.`;
  return `${gaps} of ${days} days have no figures: shown as gaps, not zeros.`;
}

export function dailyChart<T extends { day: string }>(input: DailyChartInput<T>): DailyChartData {
  const days = chartDays(input.from, input.to);
  // Several rows may share a day (one per unit): the caller passes one row per day per chart.
  const byDay = new Map<string, T>();
  for (const r of input.rows) byDay.set(r.day, r);

  const rows: DailyRow[] = days.map((day) => {
    const source = byDay.get(day);
    const row: DailyRow = { day };
    for (const s of input.series) {
      const v = source ? s.pick(source) : null;
      row[s.key] = v === null || v === undefined || !Number.isFinite(v) ? null : v;
    }
    return row;
  });
  const daysWithData = rows.filter((r) => input.series.some((s) => r[s.key] !== null)).length;

  const refLines = input.refLines ?? [];
  const valuesOn = (axis: 'left' | 'right') =>
    input.series.filter((s) => (s.axis ?? 'left') === axis).flatMap((s) => rows.map((r) => r[s.key] as number | null));
  const refsOn = (axis: 'left' | 'right') => refLines.filter((r) => (r.axis ?? 'left') === axis).map((r) => r.y);

  const hasRight = input.series.some((s) => s.axis === 'right');
  if (hasRight && !input.rightLabel) throw new Error(`chart ${input.id}: a right-axis series needs rightLabel`);

  return {
    id: input.id,
    title: input.title,
    xLabel: dayAxisLabel(input.timeZone),
    left: { label: input.leftLabel, domain: zeroBasedDomain(valuesOn('left'), refsOn('left')) },
    ...(hasRight ? { right: { label: input.rightLabel!, domain: zeroBasedDomain(valuesOn('right'), refsOn('right')) } } : {}),
    rows,
    series: input.series.map(({ pick: _pick, ...spec }) => spec),
    refLines: [...refLines],
    bands: [...(input.bands ?? [])],
    days: days.length,
    daysWithData,
    note: `${input.about} ${gapNote(days.length, daysWithData)}`,
  };
}

/** The series key of a unit: prefixed, because a unit id may itself be "day". */
export const unitKey = (unit: string) => `u_${unit}`;

export type UnitDayRow = { day: string } & Record<string, number | null>;

/**
 * Per-unit rows (one per day and unit) → one row per day with a column per
 * unit (`unitKey(id)`), for charts that draw one line per thruster or
 * reference system. Units are in natural order (T2 before T10).
 */
export function pivotByUnit<T extends { day: string }>(
  rows: readonly T[],
  unitOf: (row: T) => string,
  pick: (row: T) => number | null | undefined,
): { units: string[]; rows: UnitDayRow[] } {
  const units = [...new Set(rows.map(unitOf))].sort(compareNatural);
  const byDay = new Map<string, UnitDayRow>();
  for (const r of rows) {
    let row = byDay.get(r.day);
    if (!row) {
      row = { day: r.day } as UnitDayRow;
      byDay.set(r.day, row);
    }
    const v = pick(r);
    row[unitKey(unitOf(r))] = v === null || v === undefined || !Number.isFinite(v) ? null : v;
  }
  return { units, rows: [...byDay.values()] };
}
