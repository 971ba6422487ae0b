import type { Queryable } from '../context';

export interface VesselRef {
  id: number;
  key: string;
  /** The watch circles configured now, m. */
  watchCirclesM: number[];
}

/** A registered vessel by key; null when there is none. */
export async function vesselByKey(db: Queryable, key: string): Promise<VesselRef | null> {
  const { rows } = await db.query<{ id: number; key: string; watch_circles_m: number[] }>(
    'SELECT id, key, watch_circles_m FROM vessel WHERE key = $1',
    [key],
  );
  const row = rows[0];
  return row ? { id: row.id, key: row.key, watchCirclesM: row.watch_circles_m } : null;
}


/**
 * The rows of a per-vessel daily table for a range: `sql` takes $1 = vessel
 * id, $2 = from, $3 = to. null when no vessel has the key.
 */
export async function vesselRangeRows<T>(
  db: Queryable,
  key: string,
  range: { from: string; to: string },
  sql: string,
): Promise<{ vessel: VesselRef; rows: T[] } | null> {
  const vessel = await vesselByKey(db, key);
  if (!vessel) return null;
  const { rows } = await db.query(sql, [vessel.id, range.from, range.to]);
  return { vessel, rows: rows as T[] };
}
