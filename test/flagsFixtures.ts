import type { Pool } from 'pg';
import type { SyntheticFleet } from '../lib/flags/evaluation/syntheticFleet';

/**
 * Daily rows for the flag tests, written straight into the daily tables
 * (the flag job reads nothing else), and the vessels they belong to.
 */

export async function insertVessel(pool: Pool, key: string): Promise<number> {
  const { rows } = await pool.query<{ id: number }>(
    `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
     VALUES ($1, $2, 'construction', 2, '{3,5}', '{3,5}') RETURNING id`,
    [key, key.toUpperCase()],
  );
  return rows[0]!.id;
}

export interface VesselDayRow {
  day: string;
  p95_norm?: number | null;
  p95_m?: number | null;
  hdg_rms_deg?: number | null;
  wind_mean_ms?: number | null;
  limit_events_per_dp_day?: number | null;
}

export async function insertVesselDays(pool: Pool, vesselId: number, rows: readonly VesselDayRow[]): Promise<void> {
  if (rows.length === 0) return;
  const col = <K extends keyof VesselDayRow>(k: K) => rows.map((r) => r[k] ?? null);
  await pool.query(
    `INSERT INTO daily_vessel (vessel_id, day, station_records, dp_intervals, samples, dp_hours, p95_m, p95_norm, hdg_rms_deg, wind_mean_ms, limit_events_per_dp_day)
     SELECT $1, d, 1440, 1440, 86400, 24, p95, norm, hdg, wind, lim
       FROM unnest($2::date[], $3::float8[], $4::float8[], $5::float8[], $6::float8[], $7::float8[]) AS u (d, p95, norm, hdg, wind, lim)
     ON CONFLICT (vessel_id, day) DO UPDATE SET p95_m = EXCLUDED.p95_m, p95_norm = EXCLUDED.p95_norm, hdg_rms_deg = EXCLUDED.hdg_rms_deg,
       wind_mean_ms = EXCLUDED.wind_mean_ms, limit_events_per_dp_day = EXCLUDED.limit_events_per_dp_day`,
    [vesselId, col('day'), col('p95_m'), col('p95_norm'), col('hdg_rms_deg'), col('wind_mean_ms'), col('limit_events_per_dp_day')],
  );
}

export async function insertThrusterDays(pool: Pool, vesselId: number, unit: string, rows: readonly { day: string; efficiency_index: number | null }[]): Promise<void> {
  await pool.query(
    `INSERT INTO daily_thruster (vessel_id, unit_id, day, run_hours, starts, unbanded_run_s, efficiency_index)
     SELECT $1, $2, d, 24, 1, 0, e FROM unnest($3::date[], $4::float8[]) AS u (d, e)`,
    [vesselId, unit, rows.map((r) => r.day), rows.map((r) => r.efficiency_index)],
  );
}

export async function insertRefDays(pool: Pool, vesselId: number, unit: string, rows: readonly { day: string; sd_m_median: number | null; rejections: number | null }[]): Promise<void> {
  await pool.query(
    `INSERT INTO daily_ref (vessel_id, unit_id, day, online_hours, sd_m_median, rejections)
     SELECT $1, $2, d, 24, s, r FROM unnest($3::date[], $4::float8[], $5::int[]) AS u (d, s, r)`,
    [vesselId, unit, rows.map((r) => r.day), rows.map((r) => r.sd_m_median), rows.map((r) => r.rejections)],
  );
}

/** The whole synthetic fleet into the daily tables; vessel key → id. */
export async function insertSyntheticFleet(pool: Pool, fleet: SyntheticFleet): Promise<Map<string, number>> {
  const ids = new Map<string, number>();
  for (const key of fleet.vessels) {
    const id = await insertVessel(pool, key);
    ids.set(key, id);
    await insertVesselDays(pool, id, fleet.vesselDays.filter((d) => d.vessel === key));
    const units = (rows: typeof fleet.thrusterDays) => [...new Set(rows.filter((r) => r.vessel === key).map((r) => r.unit))];
    for (const unit of units(fleet.thrusterDays)) {
      await insertThrusterDays(pool, id, unit, fleet.thrusterDays.filter((r) => r.vessel === key && r.unit === unit).map((r) => ({ day: r.day, efficiency_index: r.efficiency_index ?? null })));
    }
    for (const unit of units(fleet.refDays)) {
      await insertRefDays(pool, id, unit, fleet.refDays.filter((r) => r.vessel === key && r.unit === unit).map((r) => ({ day: r.day, sd_m_median: r.sd_m_median ?? null, rejections: r.rejections ?? null })));
    }
  }
  return ids;
}
