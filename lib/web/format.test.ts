import { describe, expect, it } from 'vitest';
import { count, fixed, metres, percent } from './format';

describe('format', () => {
  it('shows a missing figure as a dash, never 0', () => {
    expect(fixed(null, 2)).toBe('—');
    expect(percent(undefined)).toBe('—');
    expect(metres(null)).toBe('—');
    expect(count(0)).toBe('0');
  });

  it('writes the overflow bin as "≥ 10 m"', () => {
    expect(metres(10, true)).toBe('≥ 10 m');
    expect(metres(1.234)).toBe('1.23 m');
  });

  it('groups thousands and does not print minus zero', () => {
    expect(fixed(12345.678, 1)).toBe('12,345.7');
    expect(fixed(-0.001, 1)).toBe('0.0');
  });
});
