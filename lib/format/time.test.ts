import { describe, expect, it } from 'vitest';
import { formatAge, utcParts } from './time';

describe('formatAge', () => {
  it.each([
    [-5_000, '0 s ago'],
    [42_000, '42 s ago'],
    [12 * 60_000 + 59_000, '12 min ago'],
    [5 * 3600_000, '5 h ago'],
    [5 * 3600_000 + 3 * 60_000, '5 h 3 min ago'],
    [30 * 3600_000, '1 d 6 h ago'],
    [12 * 86_400_000 + 3600_000, '12 d ago'],
  ])('%i ms → %s', (ms, text) => expect(formatAge(ms)).toBe(text));
});

describe('utcParts', () => {
  it('splits an instant into its UTC date and time', () => {
    expect(utcParts(new Date('2026-12-01T23:39:00+01:00'))).toEqual(['2026-12-01', '22:39:00']);
  });
});
