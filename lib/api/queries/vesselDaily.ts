import type { DailyVesselRow } from '../../jobs/daily/figures';
import type { Queryable } from '../context';
import type { DayRange } from '../params';
import { limitKey } from '../../metrics/withinLimit';
import { vesselRangeRows } from './vesselByKey';

/**
 * GET /api/v1/vessels/{key}/daily: the rows of daily_vessel for the range,
 * by day. A day without a row (not computed yet, or no telemetry) is absent,
 * never a row of zeros. within_pct is passed on as the job stored it, keyed by the
 * watch circles the vessel had then.
 */
export type VesselDayItem = Omit<DailyVesselRow, 'vessel_id' | 'station_records' | 'dp_intervals' | 'samples' | 'err_hist' | 'wind_beam_share'> & {
  p95_norm: number | null;
};

export interface VesselDaily {
  vessel: string;
  /** within_pct keys of the limits configured now: the CSV columns even when no day has them. */
  limitKeys: string[];
  days: VesselDayItem[];
}

const SQL = `
  SELECT to_char(day, 'YYYY-MM-DD') AS day, dp_hours, p50_m, p95_m, p95_overflow, p99_m, r_rms_m, r_max_m,
         within_pct, hdg_rms_deg, hdg_max_abs_deg, wind_mean_ms, gust_max_ms, current_mean_ms, p95_norm,
         limit_events, limit_seconds, limit_events_per_dp_day, blackouts, peak_load_ratio
    FROM daily_vessel
   WHERE vessel_id = $1 AND day BETWEEN $2::date AND $3::date
   ORDER BY day`;

export async function getVesselDaily(db: Queryable, key: string, range: DayRange): Promise<VesselDaily | null> {
  const found = await vesselRangeRows<VesselDayItem>(db, key, range, SQL);
  if (!found) return null;
  return { vessel: found.vessel.key, limitKeys: found.vessel.watchCirclesM.map(limitKey), days: found.rows };
}
