import { describe, expect, it } from 'vitest';
import { parsePageRange } from './dayRangeParams';

const today = '2026-12-02';

describe('parsePageRange', () => {
  it('defaults to the 30 days ending today', () => {
    expect(parsePageRange({}, today)).toEqual({ from: '2026-11-03', to: today, days: 30, preset: 30, problem: null });
  });

  it('takes a preset and an explicit range', () => {
    expect(parsePageRange({ days: '7' }, today)).toMatchObject({ from: '2026-11-26', to: today, preset: 7 });
    expect(parsePageRange({ from: '2026-10-01', to: '2026-10-31' }, today)).toEqual({
      from: '2026-10-01',
      to: '2026-10-31',
      days: 31,
      preset: null,
      problem: null,
    });
    // A leap year's 366 days fit.
    expect(parsePageRange({ from: '2024-01-01', to: '2024-12-31' }, today).days).toBe(366);
  });

  it('falls back to the default and says why', () => {
    expect(parsePageRange({ from: '2026-13-01' }, today)).toMatchObject({ days: 30, problem: expect.stringContaining('could not be read') });
    expect(parsePageRange({ from: '2026-12-02', to: '2026-12-01' }, today).problem).toContain('is after');
    expect(parsePageRange({ from: '2025-01-01', to: '2026-12-01' }, today).problem).toContain('more than a page draws');
  });
});
