import { SUBJECT_KINDS, WATCHLIST_ORDERS, type WatchlistFilter } from '../queries/watchlist';
import { choice, param, type RawSearchParams } from './searchParams';

/**
 * The watchlist's URL: which statuses (live = open and acknowledged, the
 * default), vessel, subject kind, metric and order. Unknown values fall back
 * to the default; vessel and metric are bound as parameters, never spliced.
 */
export const STATUS_VIEWS = ['live', 'open', 'acknowledged', 'closed'] as const;
export type StatusView = (typeof STATUS_VIEWS)[number];

const STATUSES: Record<StatusView, WatchlistFilter['statuses']> = {
  live: ['open', 'acknowledged'],
  open: ['open'],
  acknowledged: ['acknowledged'],
  closed: ['closed'],
};

export interface WatchlistView {
  status: StatusView;
  filter: WatchlistFilter;
}

export function parseWatchlistView(params: RawSearchParams): WatchlistView {
  const status = choice(params, 'status', STATUS_VIEWS, 'live');
  const subject = param(params, 'subject');
  return {
    status,
    filter: {
      statuses: STATUSES[status],
      vessel: param(params, 'vessel'),
      subjectKind: (SUBJECT_KINDS as readonly string[]).includes(subject ?? '') ? (subject as WatchlistFilter['subjectKind']) : undefined,
      metric: param(params, 'metric'),
      order: choice(params, 'order', WATCHLIST_ORDERS, 'severity'),
    },
  };
}
