import type { Queryable } from '../context';
import type { DayRange } from '../params';
import { vesselRangeRows } from './vesselByKey';

/**
 * GET /api/v1/vessels/{key}/thrusters/daily: daily_thruster rows for the
 * range, by day and thruster id. Every unit the telemetry sent is listed,
 * registered or not (the register may lag a refit); days without a stored
 * row are absent.
 */
export interface ThrusterDayItem {
  day: string;
  thruster: string;
  run_hours: number;
  wear_hours: number | null;
  starts: number;
  azimuth_travel_deg: number | null;
  efficiency_index: number | null;
}

const SQL = `
  SELECT to_char(day, 'YYYY-MM-DD') AS day, unit_id AS thruster, run_hours, wear_hours, starts,
         azimuth_travel_deg, efficiency_index
    FROM daily_thruster
   WHERE vessel_id = $1 AND day BETWEEN $2::date AND $3::date
   ORDER BY day, unit_id`;

export async function getThrusterDaily(
  db: Queryable,
  key: string,
  range: DayRange,
): Promise<{ vessel: string; days: ThrusterDayItem[] } | null> {
  const found = await vesselRangeRows<ThrusterDayItem>(db, key, range, SQL);
  return found && { vessel: found.vessel.key, days: found.rows };
}
