import type { Queryable } from '../api/context';
import type { RankingVessel, RankingWindow } from '../web/fleetRanking';

/**
 * What the fleet ranking needs from the store, in three statements:
 * - every registered vessel with its campaigns and last station record
 *   (`last_seen` as in the API: max(t) of ts_station, one index probe per
 *   partition or chunk);
 * - per vessel, the score window's daily_vessel rows summed up (read on
 *   daily_vessel_day_idx): one row per vessel instead of one per
 *   vessel-day, because turning 15,000 rows into JavaScript values cost the
 *   fleet page more than everything else it does. Sums skip missing figures
 *   and are NULL when none is present (SQL's sum), the median is
 *   percentile_cont(0.5) (the mean of the middle two for an even count, as
 *   lib/metrics/refs.ts median), and the days with a p95 come as one text
 *   "offset:p95:overflow,…" (float8 text is exact), decoded only for the
 *   rows a page draws (lib/web/fleetRanking.ts);
 * - flags not closed, counted by vessel and severity (flag_one_live_idx).
 * Thruster service figures come from lib/queries/thrusterWear.ts.
 */

const VESSELS_SQL = `
  SELECT v.id, v.key, v.name, v.type, v.dp_class, v.watch_circles_m,
         (SELECT max(s.t) FROM ts_station s WHERE s.vessel_id = v.id) AS last_seen,
         coalesce((SELECT array_agg(c.key ORDER BY c.key)
                     FROM campaign_vessel cv JOIN campaign c ON c.id = cv.campaign_id
                    WHERE cv.vessel_id = v.id), '{}') AS campaigns
    FROM vessel v
   ORDER BY v.name, v.key`;

const WINDOW_SQL = `
  SELECT d.vessel_id,
         sum(d.dp_hours) AS dp_hours,
         sum(d.limit_events) AS limit_events,
         percentile_cont(0.5) WITHIN GROUP (ORDER BY d.p95_norm) AS p95_norm_median,
         string_agg((d.day - $1::date) || ':' || d.p95_m || ':' || CASE WHEN d.p95_overflow THEN 1 ELSE 0 END, ',' ORDER BY d.day)
           FILTER (WHERE d.p95_m IS NOT NULL) AS p95_days
    FROM daily_vessel d
   WHERE d.day BETWEEN $1::date AND $2::date
   GROUP BY d.vessel_id`;

const FLAGS_SQL = `
  SELECT v.key AS vessel, f.severity, count(*)::int AS n
    FROM flag f JOIN vessel v ON v.id = f.vessel_id
   WHERE f.status <> 'closed'
   GROUP BY v.key, f.severity`;

export interface FleetRankingInputs {
  vessels: RankingVessel[];
  windows: RankingWindow[];
  openFlags: Map<string, Record<string, number>>;
}

export async function getFleetRankingInputs(db: Queryable, window: { from: string; to: string }): Promise<FleetRankingInputs> {
  const [vessels, windows, flags] = await Promise.all([
    db.query<{ id: number; key: string; name: string; type: string; dp_class: number; watch_circles_m: number[]; last_seen: Date | null; campaigns: string[] }>(
      VESSELS_SQL,
    ),
    db.query<{
      vessel_id: number;
      dp_hours: number | null;
      limit_events: number | null;
      p95_norm_median: number | null;
      p95_days: string | null;
    }>(WINDOW_SQL, [window.from, window.to]),
    db.query<{ vessel: string; severity: string; n: number }>(FLAGS_SQL),
  ]);
  const keyOf = new Map(vessels.rows.map((v) => [v.id, v.key]));
  const openFlags = new Map<string, Record<string, number>>();
  for (const f of flags.rows) openFlags.set(f.vessel, { ...openFlags.get(f.vessel), [f.severity]: f.n });
  return {
    vessels: vessels.rows.map((v) => ({
      key: v.key,
      name: v.name,
      type: v.type,
      dpClass: Number(v.dp_class),
      campaigns: v.campaigns,
      watchCirclesM: v.watch_circles_m,
      lastSeen: v.last_seen,
    })),
    windows: windows.rows.map((w) => ({
      vessel: keyOf.get(w.vessel_id) ?? '',
      dpHours: w.dp_hours,
      limitEvents: w.limit_events,
      p95NormMedian: w.p95_norm_median,
      p95Days: w.p95_days,
    })),
    openFlags,
  };
}
