import { describe, expect, it } from 'vitest';
import { chartDays, dayAxisLabel, fleetTime, longDay, shortDay, trailingRange, valuesByDay } from './days';

describe('chartDays', () => {
  it('lists every calendar day, both ends included, across a month end', () => {
    expect(chartDays('2026-02-27', '2026-03-02')).toEqual(['2026-02-27', '2026-02-28', '2026-03-01', '2026-03-02']);
  });

  it('refuses more than a year of days', () => {
    expect(chartDays('2024-01-01', '2024-12-31')).toHaveLength(366);
    expect(() => chartDays('2024-01-01', '2025-01-01')).toThrow(/more than 366 days/);
  });
});

describe('valuesByDay', () => {
  it('gives null, never 0, for a day without a row or without a figure', () => {
    const days = ['2026-12-01', '2026-12-02', '2026-12-03', '2026-12-04'];
    const rows = [
      { day: '2026-12-01', v: 1.5 },
      { day: '2026-12-03', v: null },
      { day: '2026-12-04', v: 0 },
    ];
    expect(valuesByDay(days, rows, (r) => r.v)).toEqual([1.5, null, null, 0]);
  });

  it('treats a non-finite figure as missing', () => {
    expect(valuesByDay(['2026-12-01'], [{ day: '2026-12-01', v: Number.NaN }], (r) => r.v)).toEqual([null]);
  });
});

describe('fleet time zone', () => {
  // 23:30 UTC on 1 December is already 2 December in New Zealand (UTC+13 in
  // summer; source: IANA tz database, Pacific/Auckland) and still 1 December in Oslo.
  const now = new Date('2026-12-01T23:30:00Z');

  it('ends the default range on today in the fleet zone, not in UTC', () => {
    expect(trailingRange(now, 'Pacific/Auckland', 30)).toEqual({ from: '2026-11-03', to: '2026-12-02', today: '2026-12-02' });
    expect(trailingRange(now, 'Europe/Oslo', 7)).toEqual({ from: '2026-11-26', to: '2026-12-02', today: '2026-12-02' });
    expect(trailingRange(now, 'UTC', 7)).toEqual({ from: '2026-11-25', to: '2026-12-01', today: '2026-12-01' });
  });

  it('writes instants as fleet wall-clock time, across a summer-time change', () => {
    expect(fleetTime(now, 'Pacific/Auckland')).toBe('2026-12-02 12:30');
    // EU summer time started 01:00 UTC on 29 March 2026: 00:30 UTC is 01:30 CET, 01:30 UTC is 03:30 CEST.
    expect(fleetTime(new Date('2026-03-29T00:30:00Z'), 'Europe/Oslo')).toBe('2026-03-29 01:30');
    expect(fleetTime(new Date('2026-03-29T01:30:00Z'), 'Europe/Oslo')).toBe('2026-03-29 03:30');
    expect(fleetTime(new Date('2026-03-29T00:00:00Z'), 'Europe/Oslo')).toBe('2026-03-29 01:00');
  });

  it('names the zone on the day axis', () => {
    expect(dayAxisLabel('Europe/Oslo')).toBe('Fleet day (Europe/Oslo)');
  });

  it('labels calendar days without shifting them by any zone', () => {
    expect(shortDay('2026-12-02')).toBe('2 Dec');
    expect(shortDay('2027-01-31')).toBe('31 Jan');
    expect(longDay('2026-03-29')).toBe('29 Mar 2026');
  });
});
