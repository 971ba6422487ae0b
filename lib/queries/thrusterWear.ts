import type { Queryable } from '../api/context';
import { TRAILING_DAYS } from '../metrics/serviceProjection';
import { addDays } from '../time/fleetDay';
import type { RankingThruster } from '../web/fleetRanking';

/**
 * Every registered thruster's wear against its service interval, fleet-wide,
 * as of `asOf`: the same rules as the API's per-vessel figures
 * (lib/api/queries/thrusterService.ts, metrics-v1 "Thruster wear"):
 * total = wear_h_at_install + Σ daily wear_hours up to asOf (a day without a
 * figure adds nothing); trailing rate = mean daily wear over the days of the
 * 30 days ending on asOf that have a figure.
 *
 * One grouped statement over daily_thruster. Over a long history this reads
 * every row (about a million for 500 vessels × 6 thrusters × a year), so the
 * fleet page keeps the answer for a few minutes (app/page.tsx); the vessel
 * page reads its own thrusters live.
 */

const SQL = `
  SELECT v.key AS vessel, t.unit_id, t.service_interval_h, t.wear_h_at_install,
         coalesce(w.total, 0) AS wear_sum, w.recent_sum, w.recent_days
    FROM thruster t
    JOIN vessel v ON v.id = t.vessel_id
    LEFT JOIN (
      SELECT vessel_id, unit_id,
             sum(wear_hours) AS total,
             sum(wear_hours) FILTER (WHERE day >= $1::date) AS recent_sum,
             count(wear_hours) FILTER (WHERE day >= $1::date)::int AS recent_days
        FROM daily_thruster
       WHERE day <= $2::date
       GROUP BY vessel_id, unit_id) w ON w.vessel_id = t.vessel_id AND w.unit_id = t.unit_id`;

export async function getThrusterWear(db: Queryable, asOf: string): Promise<RankingThruster[]> {
  const { rows } = await db.query<{
    vessel: string;
    unit_id: string;
    service_interval_h: number;
    wear_h_at_install: number;
    wear_sum: number;
    recent_sum: number | null;
    recent_days: number | null;
  }>(SQL, [addDays(asOf, -(TRAILING_DAYS - 1)), asOf]);
  return rows.map((r) => ({
    vessel: r.vessel,
    unit: r.unit_id,
    serviceIntervalH: r.service_interval_h,
    toServiceH: r.service_interval_h - (r.wear_h_at_install + r.wear_sum),
    ratePerDay: r.recent_days ? r.recent_sum! / r.recent_days : null,
  }));
}
