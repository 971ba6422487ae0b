import type { Pool, PoolClient } from 'pg';

/**
 * The daily roll-up (daily_vessel): DP hours and station record count per
 * vessel and fleet day. Day boundaries are the fleet time zone's midnights
 * (`day::timestamp AT TIME ZONE tz`), so a 23- or 25-hour DST day is right.
 * Every function here is idempotent: recomputing a day gives the same row.
 */

const RECOMPUTE_SQL = `
  INSERT INTO daily_vessel (vessel_id, day, dp_hours, station_records, computed_at)
  SELECT d.vessel_id, d.day,
         coalesce(sum(s.dp_s), 0) / 3600.0,
         count(s.t)::int,
         now()
    FROM unnest($1::int[], $2::date[]) AS d (vessel_id, day)
    LEFT JOIN ts_station s
      ON s.vessel_id = d.vessel_id
     AND s.t >= (d.day::timestamp AT TIME ZONE $3)
     AND s.t <  ((d.day + 1)::timestamp AT TIME ZONE $3)
   GROUP BY d.vessel_id, d.day
  ON CONFLICT (vessel_id, day) DO UPDATE
     SET dp_hours = EXCLUDED.dp_hours,
         station_records = EXCLUDED.station_records,
         computed_at = EXCLUDED.computed_at`;

export interface VesselDay {
  vesselId: number;
  day: string;
}

export async function recomputeDays(db: Pool | PoolClient, days: VesselDay[], timeZone: string): Promise<void> {
  if (days.length === 0) return;
  await db.query(RECOMPUTE_SQL, [days.map((d) => d.vesselId), days.map((d) => d.day), timeZone]);
}

/**
 * Recompute up to `limit` days marked dirty by ingest and clear their marks,
 * in one transaction. Marks are claimed with SKIP LOCKED, so several job
 * processes never compute the same vessel-day at once; a record arriving
 * meanwhile re-marks its day after we commit, and the next run picks it up.
 */
export async function recomputeDirtyDays(pool: Pool, timeZone: string, limit = 500): Promise<VesselDay[]> {
  const client = await pool.connect();
  try {
    await client.query('BEGIN');
    const { rows } = await client.query<{ vessel_id: number; day: string }>(
      `DELETE FROM dirty_day
        WHERE (vessel_id, day) IN (
          SELECT vessel_id, day FROM dirty_day ORDER BY day, vessel_id LIMIT $1 FOR UPDATE SKIP LOCKED)
        RETURNING vessel_id, day`,
      [limit],
    );
    const days = rows.map((r) => ({ vesselId: r.vessel_id, day: r.day }));
    await recomputeDays(client, days, timeZone);
    await client.query('COMMIT');
    return days;
  } catch (error) {
    await client.query('ROLLBACK').catch(() => {});
    throw error;
  } finally {
    client.release();
  }
}

/** Every registered vessel for one fleet day (the nightly run). */
export async function recomputeFleetDay(pool: Pool, day: string, timeZone: string): Promise<number> {
  const { rows } = await pool.query<{ id: number }>('SELECT id FROM vessel ORDER BY id');
  await recomputeDays(pool, rows.map((r) => ({ vesselId: r.id, day })), timeZone);
  return rows.length;
}
