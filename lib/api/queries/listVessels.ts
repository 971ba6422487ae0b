import type { Queryable } from '../context';

/**
 * GET /api/v1/vessels: every registered vessel, by key.
 *
 * - last_seen: the latest `t` of ts_station (interval start, UTC). Read as
 *   max(t) for one vessel_id, which PostgreSQL answers from the end of the
 *   (vessel_id, t) primary key of each partition or chunk: one index probe
 *   each, however long the history.
 * - open_flags: flags not closed (open or acknowledged), counted on the
 *   partial index flag_one_live_idx (its predicate is `status <> 'closed'`).
 */
export interface VesselItem {
  key: string;
  name: string;
  type: string;
  dp_class: number;
  last_seen: string | null;
  open_flags: number;
}

export const LIST_VESSELS_SQL = `
  SELECT v.key, v.name, v.type, v.dp_class,
         (SELECT max(s.t) FROM ts_station s WHERE s.vessel_id = v.id) AS last_seen,
         (SELECT count(*) FROM flag f WHERE f.vessel_id = v.id AND f.status <> 'closed')::int AS open_flags
    FROM vessel v
   ORDER BY v.key`;

export async function listVessels(db: Queryable): Promise<VesselItem[]> {
  const { rows } = await db.query<Omit<VesselItem, 'last_seen'> & { last_seen: Date | null }>(LIST_VESSELS_SQL);
  return rows.map((r) => ({
    key: r.key,
    name: r.name,
    type: r.type,
    dp_class: Number(r.dp_class),
    last_seen: r.last_seen ? r.last_seen.toISOString() : null,
    open_flags: r.open_flags,
  }));
}
