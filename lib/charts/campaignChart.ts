import type { CampaignReport } from '../api/queries/campaignReport';
import { limitKey } from '../metrics/withinLimit';
import type { AxisSpec, SeriesSpec } from './types';
import { UNIT, axisLabel } from './units';
import { toneOfIndex } from './vesselCharts';

/**
 * The campaign report's chart: per vessel, the share of DP samples inside
 * each of the campaign's watch circles over the period. A vessel without DP
 * samples has null bars (drawn as nothing), not 0 %.
 */
export interface CampaignBars {
  rows: ({ vessel: string; label: string } & Record<string, number | null | string>)[];
  series: SeriesSpec[];
  y: AxisSpec;
  xLabel: string;
  note: string;
}

export function campaignBars(report: CampaignReport): CampaignBars {
  const limits = report.campaign.watch_circles_m;
  const key = (l: number) => `within_${limitKey(l).replace('.', '_')}`;
  const withoutSamples = report.vessels.filter((v) => limits.every((l) => v.within_pct[limitKey(l)] === null || v.within_pct[limitKey(l)] === undefined));
  return {
    rows: report.vessels.map((v) => ({
      vessel: v.vessel,
      label: v.name,
      ...Object.fromEntries(limits.map((l) => [key(l), v.within_pct[limitKey(l)] ?? null])),
    })),
    series: limits.map((l, i) => ({ key: key(l), label: `Inside ${l} m`, kind: 'bar', tone: toneOfIndex(i), unit: UNIT.percent })),
    y: { label: axisLabel('DP samples inside', UNIT.percent), domain: [0, 100] },
    xLabel: 'Vessel',
    note:
      'Share of all 1 Hz DP samples of the period inside each watch circle of the campaign.' +
      (withoutSamples.length > 0 ? ` No DP samples (no bars): ${withoutSamples.map((v) => v.name).join(', ')}.` : ''),
  };
}
