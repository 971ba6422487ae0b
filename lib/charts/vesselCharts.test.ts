import { describe, expect, it } from 'vitest';
import type { RefDayItem } from '../api/queries/refDaily';
import type { ThrusterDayItem } from '../api/queries/thrusterDaily';
import type { VesselDayItem } from '../api/queries/vesselDaily';
import { flagChart, flagChartRange } from './flagChart';
import { FLAG_METRICS } from '../web/flagMetrics';
import type { DailyChartData } from './types';
import {
  accuracyChart,
  efficiencyChart,
  headingChart,
  normalisedChart,
  powerLimitChart,
  powerLossChart,
  refNoiseChart,
  weatherChart,
} from './vesselCharts';

const day = (d: string, values: Partial<VesselDayItem> = {}): VesselDayItem => ({
  day: d,
  dp_hours: 20,
  p50_m: 0.8,
  p95_m: 1.9,
  p95_overflow: false,
  p99_m: 2.4,
  r_rms_m: 1,
  r_max_m: 3,
  within_pct: { '3': 99.5, '5': 100 },
  hdg_rms_deg: 0.4,
  hdg_max_abs_deg: 1.2,
  wind_mean_ms: 9,
  gust_max_ms: 15,
  current_mean_ms: null,
  p95_norm: 1.05,
  limit_events: 2,
  limit_seconds: 90,
  limit_events_per_dp_day: 2.4,
  blackouts: 0,
  peak_load_ratio: 0.62,
  ...values,
});

const ctx = { timeZone: 'Europe/Oslo', from: '2026-11-28', to: '2026-12-02' };
const days = [day('2026-11-28'), day('2026-11-30', { p95_m: 10, p95_overflow: true, wind_mean_ms: null }), day('2026-12-02')];
const thrusters: ThrusterDayItem[] = [
  { day: '2026-11-28', thruster: 'T1', run_hours: 20, wear_hours: 4, starts: 1, azimuth_travel_deg: null, efficiency_index: 0.9 },
  { day: '2026-11-28', thruster: 'T2', run_hours: 12, wear_hours: 2, starts: 3, azimuth_travel_deg: 90, efficiency_index: 0.8 },
  { day: '2026-11-29', thruster: 'T1', run_hours: 20, wear_hours: 4, starts: 1, azimuth_travel_deg: null, efficiency_index: 0.88 },
];
const refs: RefDayItem[] = [{ day: '2026-12-01', ref: 'GNSS1', online_hours: 24, weight_mean: 0.5, sd_m_median: 0.3, rejections: 0 }];

const charts: DailyChartData[] = [
  accuracyChart(ctx, days, [3, 5]),
  weatherChart(ctx, days),
  normalisedChart(ctx, days),
  headingChart(ctx, days, [2, 4]),
  powerLimitChart(ctx, days),
  powerLossChart(ctx, days),
  efficiencyChart(ctx, thrusters),
  refNoiseChart(ctx, refs),
];

describe('vessel charts', () => {
  it.each(charts.map((c) => [c.id, c] as const))('%s: a unit in every axis label, days in the fleet zone', (_id, chart) => {
    expect(chart.left.label).toMatch(/^.+ \(.+\)$/);
    if (chart.right) expect(chart.right.label).toMatch(/^.+ \(.+\)$/);
    expect(chart.xLabel).toBe('Fleet day (Europe/Oslo)');
    expect(chart.rows.map((r) => r.day)).toEqual(['2026-11-28', '2026-11-29', '2026-11-30', '2026-12-01', '2026-12-02']);
  });

  it('accuracy: gaps on days without rows, watch circles as warning and alarm lines, overflow explained', () => {
    const chart = charts[0]!;
    expect(chart.rows.map((r) => r.p95)).toEqual([1.9, null, 10, null, 1.9]);
    expect(chart.refLines).toEqual([
      { y: 3, label: 'Watch circle 3 m', tone: 'warning' },
      { y: 5, label: 'Watch circle 5 m', tone: 'alarm' },
    ]);
    expect(chart.left).toEqual({ label: 'Radial error (m)', domain: [0, 12] });
    expect(chart.note).toContain('10 m means 10 m or more');
    expect(chart.note).toContain('2 of 5 days have no figures');
  });

  it('weather: a day whose wind sensor failed is a gap in wind, not zero wind', () => {
    expect(charts[1]!.rows.map((r) => r.wind)).toEqual([9, null, null, null, 9]);
    expect(charts[1]!.left.label).toBe('Speed (m/s)');
  });

  it('power: peak load as a percentage on its own axis, time limited in minutes', () => {
    expect(charts[4]!.rows[0]).toEqual({ day: '2026-11-28', events: 2.4, peak: 62 });
    expect(charts[4]!.right!.label).toBe('Peak load of available power (%)');
    expect(charts[5]!.rows[0]).toEqual({ day: '2026-11-28', limited: 1.5, blackouts: 0 });
    expect(charts[5]!.left.label).toBe('Time power-limited (min)');
  });

  it('efficiency: one line per thruster, gaps where a unit has no figure', () => {
    const chart = charts[6]!;
    expect(chart.series.map((s) => s.label)).toEqual(['T1', 'T2']);
    expect(chart.rows.map((r) => r.u_T2)).toEqual([0.8, null, null, null, null]);
    expect(chart.left.label).toBe('Thrust per power^⅔ (kN/kW^⅔)');
  });
});

describe('flag chart', () => {
  it('starts two weeks before the window and runs to today', () => {
    expect(flagChartRange('2026-11-01', '2026-11-30', '2026-12-02')).toEqual({ from: '2026-10-18', to: '2026-12-02' });
  });

  it('keeps an old window on the chart, at most 120 days long', () => {
    expect(flagChartRange('2026-01-01', '2026-01-30', '2026-12-02')).toEqual({ from: '2025-12-18', to: '2026-04-16' });
  });

  it('marks the window and names metric and unit', () => {
    const chart = flagChart({
      id: 'flag-1',
      metric: FLAG_METRICS.efficiency_index!,
      subjectLabel: 'Thruster T3',
      windowFrom: '2026-11-20',
      windowTo: '2026-11-25',
      range: { from: '2026-11-18', to: '2026-11-26' },
      timeZone: 'UTC',
      rows: [{ day: '2026-11-20', value: 0.9 }],
    });
    expect(chart.bands).toEqual([{ from: '2026-11-20', to: '2026-11-25', label: 'Flag window' }]);
    expect(chart.left.label).toBe('Thrust per power^⅔ (kN/kW^⅔)');
    expect(chart.title).toBe('Thruster efficiency index, Thruster T3');
    expect(chart.rows.filter((r) => r.value !== null)).toHaveLength(1);
  });
});
