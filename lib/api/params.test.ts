import { describe, expect, it } from 'vitest';
import { ApiError } from './errors';
import { MAX_RANGE_DAYS, parseChoice, parseDayRange } from './params';

const range = (query: string, today = '2026-03-01') => parseDayRange(new URLSearchParams(query), today);
const codeOf = (f: () => unknown) => {
  try {
    f();
  } catch (error) {
    return (error as ApiError).code;
  }
  return 'no error';
};

describe('parseDayRange', () => {
  it('defaults to the 30 days ending today; from alone runs to today', () => {
    expect(range('')).toEqual({ from: '2026-01-31', to: '2026-03-01' });
    expect(range('to=2024-03-01')).toEqual({ from: '2024-02-01', to: '2024-03-01' }); // 29 February counts
    expect(range('from=2026-02-20')).toEqual({ from: '2026-02-20', to: '2026-03-01' });
  });

  it('allows one day and up to 366 days, and no more', () => {
    expect(MAX_RANGE_DAYS).toBe(366);
    expect(range('from=2026-02-28&to=2026-02-28')).toEqual({ from: '2026-02-28', to: '2026-02-28' });
    expect(range('from=2024-01-01&to=2024-12-31')).toEqual({ from: '2024-01-01', to: '2024-12-31' });
    expect(codeOf(() => range('from=2023-12-31&to=2024-12-31'))).toBe('range_too_long');
    expect(codeOf(() => range('from=2026-01-01'))).toBe('no error');
  });

  it('refuses days that do not exist and reversed ranges', () => {
    expect(codeOf(() => range('from=2026-02-29'))).toBe('invalid_day');
    expect(codeOf(() => range('to=2026-3-1'))).toBe('invalid_day');
    expect(codeOf(() => range('from=2026-03-02&to=2026-03-01'))).toBe('invalid_range');
  });
});

describe('parseChoice', () => {
  it('takes a listed value or the default, and refuses anything else', () => {
    const choose = (q: string) => parseChoice(new URLSearchParams(q), 'status', ['open', 'all'] as const, 'open');
    expect(choose('')).toBe('open');
    expect(choose('status=all')).toBe('all');
    expect(codeOf(() => choose('status=ALL'))).toBe('invalid_parameter');
  });
});
