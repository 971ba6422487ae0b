import { describe, expect, it } from 'vitest';
import { parseWatchlistView } from './watchlistView';

describe('parseWatchlistView', () => {
  it('shows open and acknowledged flags, most severe first, by default', () => {
    expect(parseWatchlistView({})).toEqual({
      status: 'live',
      filter: { statuses: ['open', 'acknowledged'], vessel: undefined, subjectKind: undefined, metric: undefined, order: 'severity' },
    });
  });

  it('reads the filters and ignores what it does not know', () => {
    expect(parseWatchlistView({ status: 'closed', vessel: 'vardel-tern', subject: 'thruster', metric: 'efficiency_index', order: 'newest' }).filter).toEqual({
      statuses: ['closed'],
      vessel: 'vardel-tern',
      subjectKind: 'thruster',
      metric: 'efficiency_index',
      order: 'newest',
    });
    expect(parseWatchlistView({ status: 'everything', subject: 'crane', order: 'random' })).toMatchObject({
      status: 'live',
      filter: { subjectKind: undefined, order: 'severity' },
    });
  });
});
