import { describe, expect, it } from 'vitest';
import { dayRanges } from './dayRanges';

describe('dayRanges', () => {
  it('merges consecutive days per vessel, across a month end, and collapses duplicates', () => {
    const days = [
      { vesselId: 2, day: '2026-03-01' },
      { vesselId: 1, day: '2026-02-28' },
      { vesselId: 1, day: '2026-03-01' },
      { vesselId: 1, day: '2026-03-01' },
      { vesselId: 1, day: '2026-03-03' },
      { vesselId: 2, day: '2026-02-28' },
    ];
    expect(dayRanges(days)).toEqual([
      { vesselId: 1, from: '2026-02-28', to: '2026-03-01' },
      { vesselId: 1, from: '2026-03-03', to: '2026-03-03' },
      { vesselId: 2, from: '2026-02-28', to: '2026-03-01' },
    ]);
  });

  it('is empty for no days', () => {
    expect(dayRanges([])).toEqual([]);
  });
});
