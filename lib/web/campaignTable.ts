import type { CampaignReport, CampaignVesselFigures } from '../api/queries/campaignReport';
import { limitKey } from '../metrics/withinLimit';
import { count, fixed, hours, metres, percent } from './format';

/**
 * The campaign report's table, written once for the page and the PDF, so
 * both show the same figures the same way (the CSV carries the unrounded
 * values of the API). Figures come from getCampaignReport: p95 and "inside"
 * shares from the merged histograms of the period, sums over computed days.
 */

export interface CampaignColumn {
  key: string;
  /** Header text, unit included. */
  label: string;
  /** One line saying what the column is. */
  about: string;
}

export interface CampaignTable {
  columns: CampaignColumn[];
  rows: { vessel: string; name: string; cells: string[] }[];
}

export function campaignColumns(limitsM: readonly number[]): CampaignColumn[] {
  return [
    { key: 'days', label: 'Days with figures', about: 'Fleet days of the period with computed figures.' },
    { key: 'dp_hours', label: 'DP hours', about: 'Hours in auto position mode, summed over the days.' },
    {
      key: 'p95',
      label: 'p95 radial error',
      about: '95 % of the 1 Hz samples in DP lay within this distance of the set point (from the merged histograms of the period).',
    },
    ...limitsM.map((l) => ({
      key: `within_${limitKey(l)}`,
      label: `Inside ${l} m`,
      about: `Share of DP samples within the campaign's ${l} m watch circle.`,
    })),
    { key: 'limit_events', label: 'Power-limit events', about: 'Times the power limit cut in, every DP mode.' },
    { key: 'blackouts', label: 'Blackouts', about: 'Intervals in which a switchboard section lost all power.' },
  ];
}

export function campaignCells(v: CampaignVesselFigures, limitsM: readonly number[]): string[] {
  return [
    count(v.days_computed),
    hours(v.dp_hours),
    metres(v.p95_m, v.p95_overflow),
    ...limitsM.map((l) => percent(v.within_pct[limitKey(l)] ?? null, 1)),
    count(v.limit_events),
    count(v.blackouts),
  ];
}

export function campaignTable(report: CampaignReport): CampaignTable {
  const limits = report.campaign.watch_circles_m;
  return {
    columns: campaignColumns(limits),
    rows: report.vessels.map((v) => ({ vessel: v.vessel, name: v.name, cells: campaignCells(v, limits) })),
  };
}

export type CampaignPhase = 'upcoming' | 'running' | 'ended';

export function campaignPhase(from: string, to: string, today: string): CampaignPhase {
  if (today < from) return 'upcoming';
  if (today > to) return 'ended';
  return 'running';
}

/** "1.2345" → "1.2345" as typed; used for lat/lon, which keep the register's precision. */
export const coordinate = (value: number, positive: string, negative: string) =>
  `${fixed(Math.abs(value), 3)}° ${value < 0 ? negative : positive}`;
