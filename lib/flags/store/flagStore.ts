import type { Pool, PoolClient } from 'pg';
import type { LiveFlag } from '../lifecycle';
import type { Severity } from '../verdict';

/**
 * The flag table's writes and the reads the job needs
 * (prisma/migrations/0007_flags.sql, 0009_flag_notifications.sql).
 * Every value is bound.
 */

type Queryable = Pick<Pool, 'query'>;

export interface SeriesId {
  vesselId: number;
  subject: string;
  metric: string;
}

export const seriesIdKey = (s: SeriesId) => `${s.vesselId}|${s.subject}|${s.metric}`;

/** Live (open or acknowledged) flags of these vessels, by seriesIdKey. */
export async function liveFlags(db: Queryable, vesselIds: readonly number[]): Promise<Map<string, LiveFlag>> {
  const { rows } = await db.query<{ id: string; vessel_id: number; subject: string; metric: string; severity: Severity; clear_days: number; last_evaluated_day: string; close_proposed_day: string | null }>(
    `SELECT id, vessel_id, subject, metric, severity, clear_days, last_evaluated_day::text, close_proposed_day::text
       FROM flag WHERE status <> 'closed' AND vessel_id = ANY($1::int[])`,
    [vesselIds],
  );
  return new Map(
    rows.map((r) => [
      seriesIdKey({ vesselId: r.vessel_id, subject: r.subject, metric: r.metric }),
      { id: Number(r.id), severity: r.severity, clearDays: r.clear_days, lastEvaluatedDay: r.last_evaluated_day, closeProposedDay: r.close_proposed_day },
    ]),
  );
}

/** The fleet day each series' latest flag was closed on (closed_at in the fleet time zone), by seriesIdKey. */
export async function lastClosedDays(db: Queryable, vesselIds: readonly number[], timeZone: string): Promise<Map<string, string>> {
  const { rows } = await db.query<{ vessel_id: number; subject: string; metric: string; day: string }>(
    `SELECT vessel_id, subject, metric, max((closed_at AT TIME ZONE $2)::date)::text AS day
       FROM flag WHERE status = 'closed' AND vessel_id = ANY($1::int[])
      GROUP BY vessel_id, subject, metric`,
    [vesselIds, timeZone],
  );
  return new Map(rows.map((r) => [seriesIdKey({ vesselId: r.vessel_id, subject: r.subject, metric: r.metric }), r.day]));
}

export interface NewFlag extends SeriesId {
  method: string;
  severity: Severity;
  openedDay: string;
  windowFrom: string;
  windowTo: string;
  statistic: number;
  statisticName: string;
  explanation: string;
  evidence: Record<string, unknown>;
}

/**
 * Open a flag and queue its delivery to every enabled webhook, in the
 * caller's transaction. Null when a live flag of the series exists already
 * (another job process got there first): the partial unique index decides,
 * so two runs never open two flags.
 */
export async function openFlag(client: PoolClient, f: NewFlag): Promise<number | null> {
  const { rows } = await client.query<{ id: string }>(
    `INSERT INTO flag (vessel_id, subject, metric, method, severity, opened_day, window_from, window_to,
                       statistic, statistic_name, explanation, evidence, last_evaluated_day)
     VALUES ($1, $2, $3, $4, $5, $6::date, $7::date, $8::date, $9, $10, $11, $12::jsonb, $6::date)
     ON CONFLICT (vessel_id, subject, metric) WHERE status <> 'closed' DO NOTHING
     RETURNING id`,
    [f.vesselId, f.subject, f.metric, f.method, f.severity, f.openedDay, f.windowFrom, f.windowTo, f.statistic, f.statisticName, f.explanation, JSON.stringify(f.evidence)],
  );
  if (rows.length === 0) return null;
  const id = Number(rows[0]!.id);
  await client.query(
    `INSERT INTO flag_outbox (flag_id, webhook_id, payload)
     SELECT $1, w.id, $2::jsonb FROM flag_webhook w WHERE w.enabled
     ON CONFLICT (flag_id, webhook_id) DO NOTHING`,
    [id, JSON.stringify(await flagPayload(client, id))],
  );
  return id;
}

/** The JSON a webhook receives for a new flag: the API's fields (docs/api.md) plus the vessel's name and the evidence. */
export async function flagPayload(db: Queryable, id: number): Promise<Record<string, unknown>> {
  const { rows } = await db.query(
    `SELECT f.id::int AS id, v.key AS vessel, v.name AS vessel_name, f.subject, f.metric, f.method, f.severity,
            f.opened_day::text AS opened_day, f.window_from::text AS window_from, f.window_to::text AS window_to,
            f.statistic, f.statistic_name, f.explanation, f.status, f.evidence
       FROM flag f JOIN vessel v ON v.id = f.vessel_id WHERE f.id = $1`,
    [id],
  );
  return { event: 'flag.opened', flag: rows[0] };
}

/** Apply one evaluated day to a live flag; a no-op if it was already evaluated on that day or later. */
export async function updateFlag(db: Queryable, u: { id: number; day: string; severity: Severity; clearDays: number; closeProposedDay: string | null }): Promise<boolean> {
  const { rowCount } = await db.query(
    `UPDATE flag SET severity = $3, clear_days = $4, close_proposed_day = $5::date, last_evaluated_day = $2::date, updated_at = now()
      WHERE id = $1 AND status <> 'closed' AND last_evaluated_day < $2::date`,
    [u.id, u.day, u.severity, u.clearDays, u.closeProposedDay],
  );
  return (rowCount ?? 0) > 0;
}
