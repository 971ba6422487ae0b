import type { Pool } from 'pg';

/** Months of partitions kept ready ahead of the clock (plain PostgreSQL flavour). */
export const MONTHS_AHEAD = 3;

/**
 * Create partitions ahead and drop those past retention. On TimescaleDB both
 * SQL functions do nothing (chunks and retention policies take care of it).
 */
export async function maintainPartitions(pool: Pool, now = new Date()): Promise<{ created: number; dropped: string[] }> {
  const created = await pool.query<{ n: number }>(
    `SELECT coalesce(sum(holdfast_ensure_partitions(table_name, $1::timestamptz, $1::timestamptz + make_interval(months => $2))), 0)::int AS n
       FROM holdfast_retention`,
    [now, MONTHS_AHEAD],
  );
  const dropped = await pool.query<{ part: string }>('SELECT holdfast_apply_retention($1) AS part', [now]);
  return { created: created.rows[0]!.n, dropped: dropped.rows.map((r) => r.part) };
}
