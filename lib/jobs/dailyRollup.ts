import type { Pool } from 'pg';
import { inTransaction } from '../db/transaction';
import { computeBatch, type VesselDay } from './daily/computeBatch';
import { laneBatches } from './daily/laneBatches';

/**
 * The daily job's entry points: every figure of metrics-v1 per vessel,
 * thruster, bus and reference system and fleet day (lib/jobs/daily/).
 * Day boundaries are the fleet time zone's midnights, so a 23- or 25-hour DST
 * day is right. Idempotent: recomputing a day gives the same rows.
 */
export type { VesselDay };

/** Vessel-days per transaction: large enough to be quick, small enough to hold locks briefly. */
export const BATCH_VESSEL_DAYS = 100;

/** Batches computed at once by recomputeDays (each on its own connection). */
export const DEFAULT_CONCURRENCY = 2;

/**
 * Recompute these vessel-days now: sorted by vessel then day and cut into
 * batches of at most BATCH_VESSEL_DAYS (one transaction each), `concurrency`
 * batches at a time. The batch count is a multiple of `concurrency`, so the
 * lanes finish together, and batches end between vessels where they can
 * (each batch locks its vessels); laneBatches.ts has the rule.
 */
export async function recomputeDays(
  pool: Pool,
  days: readonly VesselDay[],
  timeZone: string,
  onProgress?: (done: number, total: number) => void,
  concurrency = DEFAULT_CONCURRENCY,
): Promise<void> {
  const lanes = Math.max(1, concurrency);
  const batches = laneBatches(days, lanes, BATCH_VESSEL_DAYS);
  const total = batches.reduce((s, b) => s + b.length, 0);
  let next = 0;
  let done = 0;
  let failed = false;
  const lane = async () => {
    while (next < batches.length && !failed) {
      const batch = batches[next++]!;
      try {
        await inTransaction(pool, (client) => computeBatch(client, batch, timeZone));
      } catch (error) {
        failed = true; // the other lane stops after its current batch
        throw error;
      }
      done += batch.length;
      onProgress?.(done, total);
    }
  };
  await Promise.all(Array.from({ length: Math.min(lanes, batches.length) }, lane));
}

/**
 * Recompute up to `limit` days marked dirty by ingest and clear their marks,
 * in one transaction. Marks are claimed with SKIP LOCKED, so several job
 * processes never take the same vessel-day; a record arriving meanwhile
 * re-marks its day after we commit, and the next run picks it up.
 */
export async function recomputeDirtyDays(pool: Pool, timeZone: string, limit = BATCH_VESSEL_DAYS): Promise<VesselDay[]> {
  return inTransaction(pool, async (client) => {
    const { rows } = await client.query<{ vessel_id: number; day: string }>(
      `DELETE FROM dirty_day
        WHERE (vessel_id, day) IN (
          SELECT vessel_id, day FROM dirty_day ORDER BY day, vessel_id LIMIT $1 FOR UPDATE SKIP LOCKED)
        RETURNING vessel_id, day::text AS day`,
      [limit],
    );
    const days = rows.map((r) => ({ vesselId: r.vessel_id, day: r.day }));
    await computeBatch(client, days, timeZone);
    return days;
  });
}

/** Every registered vessel for one fleet day (the nightly run). */
export async function recomputeFleetDay(pool: Pool, day: string, timeZone: string): Promise<number> {
  const { rows } = await pool.query<{ id: number }>('SELECT id FROM vessel ORDER BY id');
  await recomputeDays(pool, rows.map((r) => ({ vesselId: r.id, day })), timeZone);
  return rows.length;
}
