import { describe, expect, it } from 'vitest';
import { p95Trend, rankFleet, type RankingVessel, type RankingWindow } from './fleetRanking';
import { fleetPage, parseFleetView, sortRows } from './fleetView';

const today = '2026-12-02';
const now = new Date('2026-12-02T12:00:00Z');
const vessel = (key: string, extra: Partial<RankingVessel> = {}): RankingVessel => ({
  key,
  name: key.toUpperCase(),
  type: 'supply',
  dpClass: 2,
  campaigns: [],
  watchCirclesM: [3, 5],
  lastSeen: new Date('2026-12-02T11:59:00Z'),
  ...extra,
});
const window = (v: string, values: Partial<RankingWindow>): RankingWindow => ({
  vessel: v,
  dpHours: 48,
  limitEvents: 0,
  p95NormMedian: 1,
  p95Days: null,
  ...values,
});

// The window runs from 3 November (offset 0) to 2 December (offset 29).
const rows = rankFleet({
  today,
  now,
  vessels: [
    vessel('alpha', { type: 'drilling', dpClass: 3, campaigns: ['c1'] }),
    vessel('bravo', { lastSeen: new Date('2026-12-02T11:00:00Z') }),
    vessel('charlie', { lastSeen: null }),
    vessel('delta'),
  ],
  windows: [
    window('alpha', { p95Days: '28:1.5:0,29:1.7:0' }),
    window('bravo', { dpHours: 24, limitEvents: 4, p95NormMedian: 1.5, p95Days: '28:1.5:0' }),
    window('delta', { dpHours: 24, p95NormMedian: 1.25, p95Days: '17:10:1' }),
  ],
  openFlags: new Map([['delta', { alarm: 1 }]]),
  thrusters: [],
});
const byKey = (key: string) => rows.find((r) => r.key === key)!;

describe('rankFleet', () => {
  it('scores, ranks (ties share a rank) and marks stale vessels', () => {
    expect(rows.map((r) => [r.key, r.health.score, r.rank, r.stale])).toEqual([
      ['alpha', 100, 1, false],
      // p95_norm 1.5 loses all 40, 4 events per DP day all 20: 40 of 85 left.
      ['bravo', Math.round((100 * 25) / 85), 3, true],
      ['charlie', null, null, true],
      // 1.25 loses 20 of 40, alarm 3 of 6 points loses 12.5 of 25: 100 − 32.5/85·100.
      ['delta', Math.round(100 * (1 - 32.5 / 85)), 2, false],
    ]);
  });

  it('keeps a 30-day p95 trend with gaps and the latest figure', () => {
    const alpha = byKey('alpha');
    expect(p95Trend(alpha)).toHaveLength(30);
    expect(p95Trend(alpha).slice(-3)).toEqual([null, 1.5, 1.7]);
    expect(alpha.latestP95).toEqual({ day: '2026-12-02', m: 1.7, overflow: false });
    expect(byKey('delta').latestP95).toEqual({ day: '2026-11-20', m: 10, overflow: true });
    expect(byKey('charlie').latestP95).toBeNull();
    expect(p95Trend(byKey('charlie')).every((v) => v === null)).toBe(true);
    expect(byKey('delta').openFlags).toEqual({ alarm: 1, warning: 0, advisory: 0, total: 1 });
  });
});

describe('fleet view', () => {
  it('reads the URL, falling back on anything it does not know', () => {
    expect(parseFleetView({ sort: 'flags', type: 'supply', class: '3', page: '2' })).toEqual({
      type: 'supply',
      dpClass: 3,
      campaign: undefined,
      sort: 'flags',
      dir: 'desc',
      page: 2,
    });
    expect(parseFleetView({ sort: 'drop table', class: '7', dir: 'sideways', page: '-1' })).toMatchObject({
      sort: 'rank',
      dpClass: undefined,
      dir: 'asc',
      page: 1,
    });
  });

  it('sorts with missing values last in both directions', () => {
    expect(sortRows(rows, 'rank', 'asc').map((r) => r.key)).toEqual(['alpha', 'delta', 'bravo', 'charlie']);
    expect(sortRows(rows, 'rank', 'desc').map((r) => r.key)).toEqual(['bravo', 'delta', 'alpha', 'charlie']);
    expect(sortRows(rows, 'seen', 'desc').map((r) => r.key)).toEqual(['alpha', 'delta', 'bravo', 'charlie']);
  });

  it('filters by type, DP class and campaign, then pages', () => {
    expect(fleetPage(rows, parseFleetView({ type: 'drilling' })).rows.map((r) => r.key)).toEqual(['alpha']);
    expect(fleetPage(rows, parseFleetView({ class: '2' })).matching).toBe(3);
    expect(fleetPage(rows, parseFleetView({ campaign: 'c1' })).rows.map((r) => r.key)).toEqual(['alpha']);
    const second = fleetPage(rows, { ...parseFleetView({ page: '2' }) }, 3);
    expect(second).toMatchObject({ page: 2, pages: 2, matching: 4 });
    expect(second.rows.map((r) => r.key)).toEqual(['charlie']);
    // A page past the end shows the last page.
    expect(fleetPage(rows, parseFleetView({ page: '9' }), 3).page).toBe(2);
  });
});
