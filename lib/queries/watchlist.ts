import type { Queryable } from '../api/context';
import type { Scope } from '../auth/scope';
import { scopeParams, scopeSpanSql } from './scopeWindows';

/**
 * Flags for the shore watchlist, with everything a card shows (lifecycle
 * fields included), filtered and ordered in SQL:
 * - status: the statuses asked for (default open and acknowledged);
 * - vessel key, subject kind (vessel, thruster, ref) and metric, each optional;
 * - order "severity": alarm, warning, advisory, then newest opened_day, then
 *   newest id; order "newest": newest first, then most severe.
 * - scope: only flags whose whole window the reader may see (canSeeSpan,
 *   in SQL so that the limit and the count apply to what is shown).
 * At most WATCHLIST_LIMIT flags; `total` says how many matched.
 */
export const WATCHLIST_LIMIT = 100;
export const SUBJECT_KINDS = ['vessel', 'thruster', 'ref'] as const;
export type SubjectKind = (typeof SUBJECT_KINDS)[number];
export const WATCHLIST_ORDERS = ['severity', 'newest'] as const;
export type WatchlistOrder = (typeof WATCHLIST_ORDERS)[number];

export interface WatchlistFilter {
  statuses: readonly ('open' | 'acknowledged' | 'closed')[];
  vessel?: string;
  subjectKind?: SubjectKind;
  metric?: string;
  order: WatchlistOrder;
}

export interface WatchlistFlag {
  id: number;
  vessel: string;
  vesselName: string;
  subject: string;
  metric: string;
  method: string;
  severity: string;
  openedDay: string;
  windowFrom: string;
  windowTo: string;
  statistic: number;
  statisticName: string;
  explanation: string;
  status: string;
  acknowledgedBy: string | null;
  acknowledgedAt: Date | null;
  acknowledgeNote: string | null;
  closedBy: string | null;
  closedAt: Date | null;
  closeReason: string | null;
  closeNote: string | null;
  clearDays: number;
  /** Set by the flag job when the condition has not held long enough: it proposes closing (a person decides). */
  closeProposedDay: string | null;
  lastEvaluatedDay: string;
  /** The test's figures as the flag job stored them (Mann–Kendall S, p; EWMA, limits; …). */
  evidence: Record<string, unknown>;
}

const SEVERITY_RANK = `CASE f.severity WHEN 'alarm' THEN 3 WHEN 'warning' THEN 2 WHEN 'advisory' THEN 1 ELSE 0 END`;
// Two fixed orderings; the filter chooses one by name, never by text from the request.
const ORDER_BY: Record<WatchlistOrder, string> = {
  severity: `${SEVERITY_RANK} DESC, f.opened_day DESC, f.id DESC`,
  newest: `f.opened_day DESC, ${SEVERITY_RANK} DESC, f.id DESC`,
};

const where = `
   WHERE f.status = ANY($1::text[])
     AND ($2::text IS NULL OR v.key = $2)
     AND ($3::text IS NULL OR split_part(f.subject, ':', 1) = $3)
     AND ($4::text IS NULL OR f.metric = $4)
     AND ${scopeSpanSql(5, 'v.key', 'f.window_from', 'f.window_to')}`;

const listSql = (order: WatchlistOrder) => `
  SELECT f.id, v.key AS vessel, v.name AS "vesselName", f.subject, f.metric, f.method, f.severity,
         to_char(f.opened_day, 'YYYY-MM-DD') AS "openedDay",
         to_char(f.window_from, 'YYYY-MM-DD') AS "windowFrom",
         to_char(f.window_to, 'YYYY-MM-DD') AS "windowTo",
         f.statistic, f.statistic_name AS "statisticName", f.explanation, f.status,
         f.acknowledged_by AS "acknowledgedBy", f.acknowledged_at AS "acknowledgedAt", f.acknowledge_note AS "acknowledgeNote",
         f.closed_by AS "closedBy", f.closed_at AS "closedAt", f.close_reason AS "closeReason", f.close_note AS "closeNote",
         f.clear_days AS "clearDays", to_char(f.close_proposed_day, 'YYYY-MM-DD') AS "closeProposedDay",
         to_char(f.last_evaluated_day, 'YYYY-MM-DD') AS "lastEvaluatedDay", f.evidence
    FROM flag f JOIN vessel v ON v.id = f.vessel_id
  ${where}
   ORDER BY ${ORDER_BY[order]}
   LIMIT ${WATCHLIST_LIMIT}`;

const COUNT_SQL = `SELECT count(*)::int AS n FROM flag f JOIN vessel v ON v.id = f.vessel_id ${where}`;

export async function getWatchlist(db: Queryable, filter: WatchlistFilter, scope: Scope): Promise<{ flags: WatchlistFlag[]; total: number }> {
  const params = [filter.statuses, filter.vessel ?? null, filter.subjectKind ?? null, filter.metric ?? null, ...scopeParams(scope)];
  const [list, total] = await Promise.all([db.query<WatchlistFlag>(listSql(filter.order), params), db.query<{ n: number }>(COUNT_SQL, params)]);
  const shown = scope.kind === 'fleet' ? list.rows : list.rows.map(withoutShoreTeamDetail);
  return { flags: shown.map((r) => ({ ...r, id: Number(r.id) })), total: total.rows[0]!.n };
}

/** Who on the shore team handled a flag, and their working notes, are not a charterer's to read. */
export const SHORE_TEAM = 'the shore team';
function withoutShoreTeamDetail(flag: WatchlistFlag): WatchlistFlag {
  return {
    ...flag,
    acknowledgedBy: flag.acknowledgedBy === null ? null : SHORE_TEAM,
    acknowledgeNote: null,
    closedBy: flag.closedBy === null ? null : SHORE_TEAM,
    closeNote: null,
  };
}

/** The choices the filters offer: vessels and metrics that have a flag the reader may see. */
export async function getWatchlistChoices(db: Queryable, scope: Scope): Promise<{ vessels: { key: string; name: string }[]; metrics: string[] }> {
  const span = scopeSpanSql(1, 'v.key', 'f.window_from', 'f.window_to');
  const params = scopeParams(scope);
  const [vessels, metrics] = await Promise.all([
    db.query<{ key: string; name: string }>(
      `SELECT v.key, v.name FROM vessel v WHERE EXISTS (SELECT 1 FROM flag f WHERE f.vessel_id = v.id AND ${span}) ORDER BY v.name, v.key`,
      params,
    ),
    db.query<{ metric: string }>(`SELECT DISTINCT f.metric FROM flag f JOIN vessel v ON v.id = f.vessel_id WHERE ${span} ORDER BY f.metric`, params),
  ]);
  return { vessels: vessels.rows, metrics: metrics.rows.map((r) => r.metric) };
}

/** Flags not closed, fleet-wide: the count the navigation shows. */
export async function countLiveFlags(db: Queryable): Promise<number> {
  const { rows } = await db.query<{ n: number }>(`SELECT count(*)::int AS n FROM flag WHERE status <> 'closed'`);
  return rows[0]!.n;
}
