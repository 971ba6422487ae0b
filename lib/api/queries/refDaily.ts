import type { Queryable } from '../context';
import type { DayRange } from '../params';
import { vesselRangeRows } from './vesselByKey';

/**
 * GET /api/v1/vessels/{key}/refs/daily: daily_ref rows for the range, by day
 * and reference system id; days without a stored row are absent.
 */
export interface RefDayItem {
  day: string;
  ref: string;
  online_hours: number | null;
  weight_mean: number | null;
  sd_m_median: number | null;
  rejections: number | null;
}

const SQL = `
  SELECT to_char(day, 'YYYY-MM-DD') AS day, unit_id AS ref, online_hours, weight_mean, sd_m_median, rejections
    FROM daily_ref
   WHERE vessel_id = $1 AND day BETWEEN $2::date AND $3::date
   ORDER BY day, unit_id`;

export async function getRefDaily(
  db: Queryable,
  key: string,
  range: DayRange,
): Promise<{ vessel: string; days: RefDayItem[] } | null> {
  const found = await vesselRangeRows<RefDayItem>(db, key, range, SQL);
  return found && { vessel: found.vessel.key, days: found.rows };
}
