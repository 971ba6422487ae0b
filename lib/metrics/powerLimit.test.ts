import { describe, expect, it } from 'vitest';
import { limitEventsPerDpDay, powerFigures } from './powerLimit';

// Source: docs spec metrics-v1 "Power limit".
describe('limitEventsPerDpDay', () => {
  it('events · 24 / dp_hours', () => {
    expect(limitEventsPerDpDay(3, 12)).toBe(6);
    expect(limitEventsPerDpDay(0, 24)).toBe(0);
  });
  it('is null at 0 DP hours ("no DP time", never 0 or infinity)', () => {
    expect(limitEventsPerDpDay(0, 0)).toBeNull();
    expect(limitEventsPerDpDay(5, 0)).toBeNull();
  });
});

describe('powerFigures', () => {
  const records = [
    {
      buses: [
        { id: 'A', kw_max: 900, kw_available: 1000, limit_s: 10, limit_events: 2, blackout: false },
        { id: 'B', kw_max: 500, kw_available: 0, limit_events: 1, blackout: true },
      ],
    },
    { buses: [{ id: 'A', kw_max: 950, kw_available: 1000, limit_s: 5, limit_events: 1 }, { id: 'B' }] },
  ];
  it('per bus', () => {
    expect(powerFigures(records, 'A')).toEqual({ limit_events: 3, limit_seconds: 15, blackouts: 0, peak_load_ratio: 0.95 });
    // B never sent limit_s nor a usable kw_available: gaps, not zeros.
    expect(powerFigures(records, 'B')).toEqual({ limit_events: 1, limit_seconds: null, blackouts: 1, peak_load_ratio: null });
  });
  it('per vessel: sums over buses, max ratio over buses', () => {
    expect(powerFigures(records)).toEqual({ limit_events: 4, limit_seconds: 15, blackouts: 1, peak_load_ratio: 0.95 });
  });
});
