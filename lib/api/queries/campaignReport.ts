import { mergeHistograms, radialQuantile } from '../../metrics/radialHistogram';
import { limitKey, withinPct } from '../../metrics/withinLimit';
import type { Queryable } from '../context';

/**
 * GET /api/v1/campaigns/{key}/report: each vessel of the campaign over the
 * campaign's fleet days, from_day to to_day clipped to today (`asOf`).
 *
 * - p95 and within_pct come from H, the element-wise sum of the period's
 *   daily err_hist (each already the merge of that day's DP intervals), with
 *   lib/metrics: a percentile over a period is read from the merged
 *   histogram, never averaged from daily percentiles (which would weigh a
 *   day of 1 DP hour like a day of 24). within_pct is for the campaign's own
 *   watch circles, not the vessel's.
 * - dp_hours, limit_events, blackouts: sums over the computed days; a sum
 *   with no figure to add is null (nothing computed), not 0.
 */
export interface CampaignVesselFigures {
  vessel: string;
  name: string;
  days_computed: number;
  dp_hours: number | null;
  p95_m: number | null;
  p95_overflow: boolean | null;
  within_pct: Record<string, number | null>;
  limit_events: number | null;
  blackouts: number | null;
}

export interface CampaignReport {
  campaign: {
    key: string;
    charterer: string;
    from: string;
    to: string;
    site: { name: string; lat: number; lon: number };
    watch_circles_m: number[];
  };
  as_of: string;
  period: { from: string; to: string } | null;
  vessels: CampaignVesselFigures[];
}

const CAMPAIGN_SQL = `
  SELECT id, key, charterer, to_char(from_day, 'YYYY-MM-DD') AS from_day, to_char(to_day, 'YYYY-MM-DD') AS to_day,
         site_name, site_lat, site_lon, watch_circles_m
    FROM campaign WHERE key = $1`;

// err_hist is bigint[]; as float8[] it arrives as numbers, exact for every
// count below 2^53.
const DAYS_SQL = `
  SELECT v.key, v.name, d.dp_hours, d.err_hist::float8[] AS err_hist, d.limit_events, d.blackouts
    FROM campaign_vessel cv
    JOIN vessel v ON v.id = cv.vessel_id
    LEFT JOIN daily_vessel d ON d.vessel_id = v.id AND d.day BETWEEN $2::date AND $3::date
   WHERE cv.campaign_id = $1
   ORDER BY v.key, d.day`;

interface CampaignRow {
  id: number;
  key: string;
  charterer: string;
  from_day: string;
  to_day: string;
  site_name: string;
  site_lat: number;
  site_lon: number;
  watch_circles_m: number[];
}

interface DayRow {
  key: string;
  name: string;
  dp_hours: number | null;
  err_hist: number[] | null;
  limit_events: number | null;
  blackouts: number | null;
}

/** Σ of the figures present; null when none is. */
function sumPresent(values: readonly (number | null)[]): number | null {
  const present = values.filter((v): v is number => v !== null);
  return present.length === 0 ? null : present.reduce((a, b) => a + b, 0);
}

function vesselFigures(rows: readonly DayRow[], limitsM: readonly number[]): CampaignVesselFigures {
  // The LEFT JOIN gives one row with a null day for a vessel with no computed day.
  const days = rows.filter((r) => r.dp_hours !== null);
  const h = mergeHistograms(days.flatMap((d) => (d.err_hist ? [d.err_hist] : [])));
  const p95 = radialQuantile(h, 0.95);
  return {
    vessel: rows[0]!.key,
    name: rows[0]!.name,
    days_computed: days.length,
    dp_hours: sumPresent(days.map((d) => d.dp_hours)),
    p95_m: p95?.m ?? null,
    p95_overflow: p95?.overflow ?? null,
    within_pct: Object.fromEntries(limitsM.map((l) => [limitKey(l), withinPct(h, l)])),
    limit_events: sumPresent(days.map((d) => d.limit_events)),
    blackouts: sumPresent(days.map((d) => d.blackouts)),
  };
}

/** null when no campaign has this key. */
export async function getCampaignReport(db: Queryable, key: string, asOf: string): Promise<CampaignReport | null> {
  const { rows } = await db.query<CampaignRow>(CAMPAIGN_SQL, [key]);
  const c = rows[0];
  if (!c) return null;
  const to = c.to_day < asOf ? c.to_day : asOf;
  const period = c.from_day <= to ? { from: c.from_day, to } : null;
  // A campaign not started yet still lists its vessels, with nothing computed:
  // BETWEEN with a null end matches no day.
  const { rows: dayRows } = await db.query<DayRow>(DAYS_SQL, [c.id, c.from_day, period ? period.to : null]);
  const byVessel = new Map<string, DayRow[]>();
  for (const r of dayRows) {
    const list = byVessel.get(r.key);
    if (list) list.push(r);
    else byVessel.set(r.key, [r]);
  }
  return {
    campaign: {
      key: c.key,
      charterer: c.charterer,
      from: c.from_day,
      to: c.to_day,
      site: { name: c.site_name, lat: c.site_lat, lon: c.site_lon },
      watch_circles_m: c.watch_circles_m,
    },
    as_of: asOf,
    period,
    vessels: [...byVessel.values()].map((r) => vesselFigures(r, c.watch_circles_m)),
  };
}
