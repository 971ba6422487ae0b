import { describe, expect, it } from 'vitest';
import { campaignBars } from './campaignChart';

describe('campaignBars', () => {
  it('has a bar per limit per vessel, null (no bar) without samples, and a unit on the axis', () => {
    const bars = campaignBars({
      campaign: { key: 'c', charterer: 'x', from: '2026-11-01', to: '2026-11-30', site: { name: 's', lat: 0, lon: 0 }, watch_circles_m: [2.5, 5] },
      as_of: '2026-12-02',
      period: { from: '2026-11-01', to: '2026-11-30' },
      vessels: [
        { vessel: 'a', name: 'A', days_computed: 3, dp_hours: 30, p95_m: 1, p95_overflow: false, within_pct: { '2.5': 97.5, '5': 100 }, limit_events: 0, blackouts: 0 },
        { vessel: 'b', name: 'B', days_computed: 0, dp_hours: null, p95_m: null, p95_overflow: null, within_pct: { '2.5': null, '5': null }, limit_events: null, blackouts: null },
      ],
    });
    expect(bars.rows).toEqual([
      { vessel: 'a', label: 'A', within_2_5: 97.5, within_5: 100 },
      { vessel: 'b', label: 'B', within_2_5: null, within_5: null },
    ]);
    expect(bars.series.map((s) => s.label)).toEqual(['Inside 2.5 m', 'Inside 5 m']);
    expect(bars.y).toEqual({ label: 'DP samples inside (%)', domain: [0, 100] });
    expect(bars.note).toContain('No DP samples (no bars): B.');
  });
});
