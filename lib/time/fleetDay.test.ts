import { describe, expect, it } from 'vitest';
import { addDays, fleetDay } from './fleetDay';

describe('fleetDay', () => {
  it('is the UTC date in UTC', () => {
    expect(fleetDay('2026-03-04T23:59:59.999Z', 'UTC')).toBe('2026-03-04');
    expect(fleetDay('2026-03-05T00:00:00Z', 'UTC')).toBe('2026-03-05');
  });

  // Source: IANA tz database — Europe/Oslo is UTC+1 in winter and UTC+2 from
  // 01:00 UTC on the last Sunday of March (2026-03-29).
  it('follows the zone offset, including across the DST change', () => {
    expect(fleetDay('2026-03-28T22:59:59Z', 'Europe/Oslo')).toBe('2026-03-28');
    expect(fleetDay('2026-03-28T23:00:00Z', 'Europe/Oslo')).toBe('2026-03-29');
    expect(fleetDay('2026-03-29T21:59:59Z', 'Europe/Oslo')).toBe('2026-03-29');
    expect(fleetDay('2026-03-29T22:00:00Z', 'Europe/Oslo')).toBe('2026-03-30');
  });
});

describe('addDays', () => {
  it('steps across month, year and leap-day boundaries', () => {
    expect(addDays('2026-03-01', -1)).toBe('2026-02-28');
    expect(addDays('2028-02-28', 1)).toBe('2028-02-29');
    expect(addDays('2026-12-31', 1)).toBe('2027-01-01');
  });
});
