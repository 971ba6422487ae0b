import { projectService, TRAILING_DAYS } from '../../metrics/serviceProjection';
import { addDays } from '../../time/fleetDay';
import type { Queryable } from '../context';
import { vesselByKey } from './vesselByKey';

/**
 * GET /api/v1/vessels/{key}/thrusters: every registered thruster of the
 * vessel with its wear against the service interval, as of `asOf` (today in
 * the fleet time zone).
 *
 * - wear_hours_total = wear_h_at_install + Σ daily wear_hours of the days up
 *   to asOf. A day whose wear is unknown (null: it ran without load bands)
 *   adds nothing, so the total is then a lower bound.
 * - wear_hours_to_service and projected_service_day come from
 *   lib/metrics/serviceProjection.ts: the trailing rate is the mean daily
 *   wear of the 30 days ending on asOf that have a figure.
 * - A projection more than 100 years ahead is null (HORIZON_DAYS there).
 */
export interface ThrusterServiceItem {
  id: string;
  kind: string;
  wear_hours_total: number;
  wear_hours_to_service: number;
  projected_service_day: string | null;
}

const THRUSTERS_SQL = `
  SELECT t.unit_id, t.kind, t.service_interval_h, t.wear_h_at_install, coalesce(w.wear, 0) AS wear_sum
    FROM thruster t
    LEFT JOIN LATERAL (
      SELECT sum(d.wear_hours) AS wear FROM daily_thruster d
       WHERE d.vessel_id = t.vessel_id AND d.unit_id = t.unit_id AND d.day <= $2::date) w ON true
   WHERE t.vessel_id = $1
   ORDER BY t.unit_id`;

const TRAILING_SQL = `
  SELECT unit_id, to_char(day, 'YYYY-MM-DD') AS day, wear_hours
    FROM daily_thruster
   WHERE vessel_id = $1 AND day BETWEEN $2::date AND $3::date`;

interface ThrusterRow {
  unit_id: string;
  kind: string;
  service_interval_h: number;
  wear_h_at_install: number;
  wear_sum: number;
}

export async function getThrusterService(
  db: Queryable,
  key: string,
  asOf: string,
): Promise<{ vessel: string; as_of: string; thrusters: ThrusterServiceItem[] } | null> {
  const vessel = await vesselByKey(db, key);
  if (!vessel) return null;
  const [{ rows: thrusters }, { rows: recent }] = await Promise.all([
    db.query<ThrusterRow>(THRUSTERS_SQL, [vessel.id, asOf]),
    db.query<{ unit_id: string; day: string; wear_hours: number | null }>(TRAILING_SQL, [
      vessel.id,
      addDays(asOf, -(TRAILING_DAYS - 1)),
      asOf,
    ]),
  ]);
  return {
    vessel: vessel.key,
    as_of: asOf,
    thrusters: thrusters.map((t) => {
      const total = t.wear_h_at_install + t.wear_sum;
      const daily = recent.filter((d) => d.unit_id === t.unit_id);
      const projection = projectService({ cumulativeWearHours: total, serviceIntervalWearHours: t.service_interval_h, daily, asOf });
      return {
        id: t.unit_id,
        kind: t.kind,
        wear_hours_total: total,
        wear_hours_to_service: projection.wear_hours_to_service,
        projected_service_day: projection.projected_service_day,
      };
    }),
  };
}
