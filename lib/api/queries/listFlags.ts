import type { Queryable } from '../context';
import { vesselByKey } from './vesselByKey';

/**
 * GET /api/v1/flags: trend flags by status and, optionally, one vessel;
 * newest first (opened_day, then id, descending).
 */
export const FLAG_STATUSES = ['open', 'acknowledged', 'closed'] as const;
export type FlagStatusFilter = (typeof FLAG_STATUSES)[number] | 'all';

export interface FlagItem {
  id: number;
  vessel: string;
  subject: string;
  metric: string;
  method: string;
  severity: string;
  opened_day: string;
  window_from: string;
  window_to: string;
  statistic: number;
  statistic_name: string;
  explanation: string;
  status: string;
}

const SQL = `
  SELECT f.id, v.key AS vessel, f.subject, f.metric, f.method, f.severity,
         to_char(f.opened_day, 'YYYY-MM-DD') AS opened_day,
         to_char(f.window_from, 'YYYY-MM-DD') AS window_from,
         to_char(f.window_to, 'YYYY-MM-DD') AS window_to,
         f.statistic, f.statistic_name, f.explanation, f.status
    FROM flag f JOIN vessel v ON v.id = f.vessel_id
   WHERE f.status = ANY($1::text[])
     AND ($2::int IS NULL OR f.vessel_id = $2::int)
   ORDER BY f.opened_day DESC, f.id DESC`;

/** null when `vesselKey` names no registered vessel. */
export async function listFlags(
  db: Queryable,
  filter: { status: FlagStatusFilter; vesselKey?: string },
): Promise<FlagItem[] | null> {
  let vesselId: number | null = null;
  if (filter.vesselKey !== undefined) {
    const vessel = await vesselByKey(db, filter.vesselKey);
    if (!vessel) return null;
    vesselId = vessel.id;
  }
  const statuses = filter.status === 'all' ? [...FLAG_STATUSES] : [filter.status];
  const { rows } = await db.query<FlagItem>(SQL, [statuses, vesselId]);
  // bigserial: a JSON number (ids stay far below 2^53).
  return rows.map((r) => ({ ...r, id: Number(r.id) }));
}
