import { addDays } from '../time/fleetDay';
import { healthScore, isThrusterDue, limitRate, SCORE_WINDOW_DAYS, type HealthScore } from './healthScore';
import { isStale } from './staleness';

/**
 * Fleet ranking rows from the query's raw material (lib/queries/fleetRanking.ts):
 * the health score of each vessel, its 30-day p95 trend, and the figures the
 * table shows; then filtering, sorting and paging as the page's URL asks.
 */

export interface RankingVessel {
  key: string;
  name: string;
  type: string;
  dpClass: number;
  campaigns: string[];
  watchCirclesM: number[];
  lastSeen: Date | null;
}

/** One vessel's figures over the score window, summed in SQL (lib/queries/fleetRanking.ts). */
export interface RankingWindow {
  vessel: string;
  /** Σ over the window's days that have the figure; null when none has. */
  dpHours: number | null;
  limitEvents: number | null;
  /** Median of the days' p95_norm (mean of the middle two for an even count); null without any. */
  p95NormMedian: number | null;
  /**
   * Days with a p95, oldest first, as the query writes them: "offset:p95:overflow,…"
   * (offset from the window's first day, metres, 1 when in the overflow bin).
   * Decoded only for the rows a page shows (p95Trend): most vessels of a
   * large fleet are ranked but not drawn.
   */
  p95Days: string | null;
}

interface P95Day {
  offset: number;
  m: number;
  overflow: boolean;
}

function decodeDay(entry: string): P95Day {
  const [offset, m, overflow] = entry.split(':');
  return { offset: Number(offset), m: Number(m), overflow: overflow === '1' };
}

/** The last (newest) day of an encoded list; null for none. */
function lastDay(encoded: string | null): P95Day | null {
  return encoded ? decodeDay(encoded.slice(encoded.lastIndexOf(',') + 1)) : null;
}

/** One p95 per day of the score window, oldest first; null on days without a figure (a gap). */
export function p95Trend(row: Pick<FleetRankRow, 'p95Days'>): (number | null)[] {
  const trend = new Array<number | null>(SCORE_WINDOW_DAYS).fill(null);
  if (!row.p95Days) return trend;
  for (const entry of row.p95Days.split(',')) {
    const d = decodeDay(entry);
    if (d.offset >= 0 && d.offset < SCORE_WINDOW_DAYS) trend[d.offset] = d.m;
  }
  return trend;
}

export interface RankingThruster {
  vessel: string;
  unit: string;
  serviceIntervalH: number;
  toServiceH: number;
  /** Mean daily wear over the trailing window's days with a figure; null without any. */
  ratePerDay: number | null;
}

export interface FleetRankRow {
  key: string;
  name: string;
  type: string;
  dpClass: number;
  campaigns: string[];
  lastSeen: Date | null;
  stale: boolean;
  health: HealthScore;
  /** 1 = highest score; null without a score. */
  rank: number | null;
  /** The window's days with a p95, encoded (see RankingWindow); drawn with p95Trend(row). */
  p95Days: string | null;
  latestP95: { day: string; m: number; overflow: boolean } | null;
  warningCircleM: number | null;
  p95NormMedian: number | null;
  limitRate: number | null;
  openFlags: { alarm: number; warning: number; advisory: number; total: number };
  thrusters: number;
  thrustersDue: number;
}

export function scoreWindow(today: string): { from: string; to: string } {
  return { from: addDays(today, -(SCORE_WINDOW_DAYS - 1)), to: today };
}

export function rankFleet(input: {
  today: string;
  now: Date;
  vessels: readonly RankingVessel[];
  windows: readonly RankingWindow[];
  /** Flags not closed: vessel key → severity → count. */
  openFlags: ReadonlyMap<string, Readonly<Record<string, number>>>;
  thrusters: readonly RankingThruster[];
}): FleetRankRow[] {
  const window = scoreWindow(input.today);
  const figures = new Map(input.windows.map((w) => [w.vessel, w]));
  const thrustersOf = new Map<string, { count: number; due: number }>();
  for (const t of input.thrusters) {
    const c = thrustersOf.get(t.vessel) ?? { count: 0, due: 0 };
    c.count++;
    if (isThrusterDue(t.toServiceH, t.serviceIntervalH, t.ratePerDay)) c.due++;
    thrustersOf.set(t.vessel, c);
  }

  const rows = input.vessels.map((v): FleetRankRow => {
    const f = figures.get(v.key);
    const flags = input.openFlags.get(v.key) ?? {};
    const thrusters = thrustersOf.get(v.key) ?? { count: 0, due: 0 };
    const dpHours = f?.dpHours ?? null;
    const limitEvents = f?.limitEvents ?? null;
    const p95NormMedian = f?.p95NormMedian ?? null;
    const latest = lastDay(f?.p95Days ?? null);
    const health = healthScore({ p95NormMedian, dpHours, limitEvents, openFlags: flags, thrusters: thrusters.count, thrustersDue: thrusters.due });
    let total = 0;
    for (const n of Object.values(flags)) total += n;
    return {
      key: v.key,
      name: v.name,
      type: v.type,
      dpClass: v.dpClass,
      campaigns: v.campaigns,
      lastSeen: v.lastSeen,
      stale: isStale(v.lastSeen, input.now),
      health,
      rank: null,
      p95Days: f?.p95Days ?? null,
      latestP95: latest ? { day: addDays(window.from, latest.offset), m: latest.m, overflow: latest.overflow } : null,
      warningCircleM: v.watchCirclesM[0] ?? null,
      p95NormMedian,
      limitRate: limitRate(limitEvents, dpHours),
      openFlags: { alarm: flags.alarm ?? 0, warning: flags.warning ?? 0, advisory: flags.advisory ?? 0, total },
      thrusters: thrusters.count,
      thrustersDue: thrusters.due,
    };
  });

  // Rank by score, highest first; equal scores share a rank (1, 2, 2, 4).
  const scored = rows.filter((r) => r.health.score !== null).sort((a, b) => b.health.score! - a.health.score!);
  scored.forEach((r, i) => {
    const prev = scored[i - 1];
    r.rank = prev && prev.health.score === r.health.score ? prev.rank : i + 1;
  });
  return rows;
}
