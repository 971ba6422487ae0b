import type { RefDayItem } from '../api/queries/refDaily';
import type { ThrusterDayItem } from '../api/queries/thrusterDaily';
import type { VesselDayItem } from '../api/queries/vesselDaily';
import { dailyChart, pivotByUnit, unitKey, type UnitDayRow } from './dailyChart';
import type { DailyChartData, ReferenceLineSpec, Tone } from './types';
import { UNIT, axisLabel } from './units';

/**
 * The vessel page's daily charts, from the rows the API query layer returns
 * (lib/api/queries). Each function makes one chart; the page draws them with
 * app/components/charts/DailyChart.tsx.
 */

export interface VesselChartContext {
  timeZone: string;
  from: string;
  to: string;
}

const UNIT_TONES: Tone[] = ['primary', 'secondary', 'tertiary', 'quaternary', 'quinary', 'senary'];
export const toneOfIndex = (i: number): Tone => UNIT_TONES[i % UNIT_TONES.length]!;

/** The first limit is the warning limit, the second the alarm limit (fleet-v1); more are drawn muted. */
export function limitLines(limits: readonly number[], what: string, unit: string): ReferenceLineSpec[] {
  return limits.map((y, i) => ({
    y,
    label: `${what} ${y} ${unit}`,
    tone: i === 0 ? 'warning' : i === 1 ? 'alarm' : 'muted',
  }));
}

export function accuracyChart(c: VesselChartContext, days: readonly VesselDayItem[], watchCirclesM: readonly number[]): DailyChartData {
  const overflow = days.some((d) => d.p95_overflow);
  return dailyChart({
    ...c,
    id: 'accuracy',
    title: 'Radial error, p50 and p95',
    rows: days,
    series: [
      { key: 'p50', label: 'p50', kind: 'line', tone: 'secondary', unit: UNIT.metre, pick: (d) => d.p50_m },
      { key: 'p95', label: 'p95', kind: 'line', tone: 'primary', unit: UNIT.metre, pick: (d) => d.p95_m },
    ],
    leftLabel: axisLabel('Radial error', UNIT.metre),
    refLines: limitLines(watchCirclesM, 'Watch circle', 'm'),
    about:
      'Distance from the set point in DP (auto position) intervals: half of the samples lay within p50, 95 % within p95.' +
      (overflow ? ' A value of 10 m means 10 m or more.' : ''),
  });
}

export function weatherChart(c: VesselChartContext, days: readonly VesselDayItem[]): DailyChartData {
  return dailyChart({
    ...c,
    id: 'weather',
    title: 'Wind and current',
    rows: days,
    series: [
      { key: 'wind', label: 'Mean wind', kind: 'line', tone: 'tertiary', unit: UNIT.metrePerSecond, pick: (d) => d.wind_mean_ms },
      { key: 'gust', label: 'Max gust', kind: 'line', tone: 'muted', dashed: true, unit: UNIT.metrePerSecond, pick: (d) => d.gust_max_ms },
      { key: 'current', label: 'Mean current', kind: 'line', tone: 'quaternary', unit: UNIT.metrePerSecond, pick: (d) => d.current_mean_ms },
    ],
    leftLabel: axisLabel('Speed', UNIT.metrePerSecond),
    about: 'Measured wind (mean and 3 s gust) and estimated current over the DP intervals, weighted by interval length.',
  });
}

export function normalisedChart(c: VesselChartContext, days: readonly VesselDayItem[]): DailyChartData {
  return dailyChart({
    ...c,
    id: 'normalised',
    title: 'p95 against the weather',
    rows: days,
    series: [{ key: 'ratio', label: 'p95 ÷ expected p95', kind: 'line', tone: 'primary', unit: UNIT.ratio, pick: (d) => d.p95_norm }],
    leftLabel: axisLabel('p95 ratio', UNIT.ratio),
    refLines: [{ y: 1, label: 'As expected for the weather', tone: 'muted' }],
    about:
      "Each day's p95 divided by what this vessel's own fit of p95 against wind (and current) expects for that day's weather. " +
      'Above 1: worse than the weather explains. Needs about 20 earlier days to fit.',
  });
}

export function headingChart(c: VesselChartContext, days: readonly VesselDayItem[], headingLimitsDeg: readonly number[]): DailyChartData {
  return dailyChart({
    ...c,
    id: 'heading',
    title: 'Heading error',
    rows: days,
    series: [
      { key: 'rms', label: 'RMS', kind: 'line', tone: 'primary', unit: UNIT.degree, pick: (d) => d.hdg_rms_deg },
      { key: 'max', label: 'Largest', kind: 'line', tone: 'muted', dashed: true, unit: UNIT.degree, pick: (d) => d.hdg_max_abs_deg },
    ],
    leftLabel: axisLabel('Heading error', UNIT.degree),
    refLines: limitLines(headingLimitsDeg, 'Heading limit', '°'),
    about: 'Heading minus heading set point in DP intervals: root mean square and largest absolute value of the day.',
  });
}

export function powerLimitChart(c: VesselChartContext, days: readonly VesselDayItem[]): DailyChartData {
  return dailyChart({
    ...c,
    id: 'power-limit',
    title: 'Power limit and peak load',
    rows: days,
    series: [
      { key: 'events', label: 'Limit events per DP day', kind: 'bar', tone: 'warning', unit: UNIT.perDpDay, pick: (d) => d.limit_events_per_dp_day },
      {
        key: 'peak',
        label: 'Peak load',
        kind: 'line',
        tone: 'primary',
        unit: UNIT.percent,
        axis: 'right',
        pick: (d) => (d.peak_load_ratio === null ? null : d.peak_load_ratio * 100),
      },
    ],
    leftLabel: axisLabel('Limit events', UNIT.perDpDay),
    rightLabel: axisLabel('Peak load of available power', UNIT.percent),
    about:
      'Times the power limit cut in, scaled to 24 DP hours (no bar: no DP time that day), and the highest ratio of consumed to available power on any switchboard.',
  });
}

export function powerLossChart(c: VesselChartContext, days: readonly VesselDayItem[]): DailyChartData {
  return dailyChart({
    ...c,
    id: 'power-loss',
    title: 'Time limited and blackouts',
    rows: days,
    series: [
      { key: 'limited', label: 'Time limited', kind: 'bar', tone: 'warning', unit: UNIT.minute, pick: (d) => (d.limit_seconds === null ? null : d.limit_seconds / 60) },
      { key: 'blackouts', label: 'Blackouts', kind: 'bar', tone: 'alarm', unit: UNIT.count, axis: 'right', pick: (d) => d.blackouts },
    ],
    leftLabel: axisLabel('Time power-limited', UNIT.minute),
    rightLabel: axisLabel('Blackouts', UNIT.count),
    about: 'Minutes during which thrust was reduced for lack of power, and intervals in which a switchboard section lost all power (every DP mode).',
  });
}

function perUnitChart<T extends { day: string }>(
  c: VesselChartContext,
  input: {
    id: string;
    title: string;
    rows: readonly T[];
    unitOf: (r: T) => string;
    pick: (r: T) => number | null;
    unit: string;
    leftLabel: string;
    about: string;
  },
): DailyChartData {
  const { units, rows } = pivotByUnit(input.rows, input.unitOf, input.pick);
  return dailyChart<UnitDayRow>({
    ...c,
    id: input.id,
    title: input.title,
    rows,
    series: units.map((u, i) => ({ key: unitKey(u), label: u, kind: 'line', tone: toneOfIndex(i), unit: input.unit, pick: (r) => r[unitKey(u)] })),
    leftLabel: input.leftLabel,
    about: input.about,
  });
}

export function efficiencyChart(c: VesselChartContext, rows: readonly ThrusterDayItem[]): DailyChartData {
  return perUnitChart(c, {
    id: 'efficiency',
    title: 'Thruster efficiency index',
    rows,
    unitOf: (r) => r.thruster,
    pick: (r) => r.efficiency_index,
    unit: UNIT.efficiency,
    leftLabel: axisLabel('Thrust per power^⅔', UNIT.efficiency),
    about:
      'Thrust divided by power to the 2/3 while running. Ideal propeller theory makes this constant for a healthy unit; a steady fall suggests fouling or damage.',
  });
}

export function refNoiseChart(c: VesselChartContext, rows: readonly RefDayItem[]): DailyChartData {
  return perUnitChart(c, {
    id: 'ref-noise',
    title: 'Position reference noise',
    rows,
    unitOf: (r) => r.ref,
    pick: (r) => r.sd_m_median,
    unit: UNIT.metre,
    leftLabel: axisLabel('Median residual SD', UNIT.metre),
    about: "Median over the day's intervals of each reference system's standard deviation against the filtered position.",
  });
}
