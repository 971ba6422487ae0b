import { describe, expect, it } from 'vitest';
import { daysBetween, isDay } from './dayRange';

describe('daysBetween', () => {
  it('lists every day, both ends included, across a leap day', () => {
    expect(daysBetween('2028-02-27', '2028-03-01')).toEqual(['2028-02-27', '2028-02-28', '2028-02-29', '2028-03-01']);
    expect(daysBetween('2026-12-01', '2026-12-01')).toEqual(['2026-12-01']);
  });

  it.each([
    ['2026-02-30', '2026-03-01', '--from: "2026-02-30" is not a day YYYY-MM-DD'],
    ['2026-03-01', '1.3.2026', '--to: "1.3.2026" is not a day YYYY-MM-DD'],
    ['2026-03-02', '2026-03-01', '--from 2026-03-02 is after --to 2026-03-01'],
  ])('rejects %s … %s', (from, to, message) => {
    expect(() => daysBetween(from, to)).toThrow(message);
  });

  it('knows real days', () => {
    expect(isDay('2026-12-31')).toBe(true);
    expect(isDay('2026-13-01')).toBe(false);
  });
});
