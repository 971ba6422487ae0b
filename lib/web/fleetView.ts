import { compareNames } from './collate';
import type { FleetRankRow } from './fleetRanking';
import { choice, param, positiveInt, type RawSearchParams } from './searchParams';

/**
 * What the fleet page's URL asks for: filters (type, DP class, campaign),
 * sort column and direction, and page. Everything happens on the server, so
 * sorting and filtering work with links and forms alone (no script needed,
 * every control reachable by keyboard).
 */

export const SORT_KEYS = ['rank', 'name', 'type', 'class', 'p95', 'norm', 'limits', 'flags', 'service', 'seen'] as const;
export type SortKey = (typeof SORT_KEYS)[number];
export type SortDir = 'asc' | 'desc';

/**
 * Vessels per page. Every row is rendered on the server and sent twice (as
 * HTML and as the React payload that hydrates it): 50 rows keep the page
 * near 250 kB and its server time within the fleet page's budget.
 */
export const PAGE_SIZE = 50;

export interface FleetView {
  type?: string;
  dpClass?: number;
  campaign?: string;
  sort: SortKey;
  dir: SortDir;
  page: number;
}

/** The direction a column sorts in when first chosen: the "best" or most natural end first. */
export const DEFAULT_DIR: Record<SortKey, SortDir> = {
  rank: 'asc',
  name: 'asc',
  type: 'asc',
  class: 'desc',
  p95: 'desc',
  norm: 'desc',
  limits: 'desc',
  flags: 'desc',
  service: 'desc',
  seen: 'desc',
};

export function parseFleetView(params: RawSearchParams): FleetView {
  const sort = choice(params, 'sort', SORT_KEYS, 'rank');
  const dpClass = Number(param(params, 'class'));
  return {
    type: param(params, 'type'),
    dpClass: [1, 2, 3].includes(dpClass) ? dpClass : undefined,
    campaign: param(params, 'campaign'),
    sort,
    dir: choice(params, 'dir', ['asc', 'desc'] as const, DEFAULT_DIR[sort]),
    page: positiveInt(params, 'page', 1),
  };
}

type Value = number | string | null;

/** Rank is the score's order: ascending rank (1 first) is descending score. */
const SORT_VALUE: Record<SortKey, (r: FleetRankRow) => Value> = {
  rank: (r) => r.rank,
  name: (r) => r.name.toLowerCase(),
  type: (r) => r.type.toLowerCase(),
  class: (r) => r.dpClass,
  p95: (r) => r.latestP95?.m ?? null,
  norm: (r) => r.p95NormMedian,
  limits: (r) => r.limitRate,
  flags: (r) => r.openFlags.total,
  service: (r) => (r.thrusters > 0 ? r.thrustersDue : null),
  seen: (r) => (r.lastSeen ? r.lastSeen.getTime() : null),
};

/** Sorted by the chosen column; rows without a value last in both directions; ties by name. */
export function sortRows(rows: readonly FleetRankRow[], sort: SortKey, dir: SortDir): FleetRankRow[] {
  const value = SORT_VALUE[sort];
  const sign = dir === 'asc' ? 1 : -1;
  return [...rows].sort((a, b) => {
    const va = value(a);
    const vb = value(b);
    if (va === null && vb !== null) return 1;
    if (vb === null && va !== null) return -1;
    if (va !== null && vb !== null && va !== vb) return (va < vb ? -1 : 1) * sign;
    return compareNames(a.name, b.name) || compareNames(a.key, b.key);
  });
}

export function filterRows(rows: readonly FleetRankRow[], view: Pick<FleetView, 'type' | 'dpClass' | 'campaign'>): FleetRankRow[] {
  return rows.filter(
    (r) =>
      (view.type === undefined || r.type === view.type) &&
      (view.dpClass === undefined || r.dpClass === view.dpClass) &&
      (view.campaign === undefined || r.campaigns.includes(view.campaign)),
  );
}

export interface FleetPage {
  rows: FleetRankRow[];
  matching: number;
  page: number;
  pages: number;
}

export function fleetPage(rows: readonly FleetRankRow[], view: FleetView, pageSize = PAGE_SIZE): FleetPage {
  const matching = filterRows(rows, view);
  const sorted = sortRows(matching, view.sort, view.dir);
  const pages = Math.max(1, Math.ceil(sorted.length / pageSize));
  const page = Math.min(view.page, pages);
  return { rows: sorted.slice((page - 1) * pageSize, page * pageSize), matching: sorted.length, page, pages };
}
