import { describe, expect, it } from 'vitest';
import { sparkline } from './sparkline';

describe('sparkline', () => {
  it('breaks the line at a missing day instead of dropping to zero', () => {
    const s = sparkline([1, 2, null, 2, 4], { width: 44, height: 12 });
    // x: 2, 12, 22, 32, 42 (2 px padding) … y from 0 at the bottom (10) to max 4 at the top (2).
    expect(s.path).toBe('M2 8L12 6M32 6L42 2');
    expect(s.dots).toEqual([]);
    expect(s.daysWithData).toBe(4);
  });

  it('draws a figure without neighbours as a dot', () => {
    const s = sparkline([null, 3, null], { width: 22, height: 12 });
    expect(s.path).toBe('');
    expect(s.dots).toEqual([{ x: 11, y: 2 }]);
  });

  it('places the reference line and keeps it in range', () => {
    const s = sparkline([1, 1], { width: 22, height: 12, reference: 4 });
    expect(s.max).toBe(4);
    expect(s.referenceY).toBe(2);
  });

  it('draws nothing at all without figures', () => {
    const s = sparkline([null, null]);
    expect(s.path).toBe('');
    expect(s.dots).toEqual([]);
    expect(s.daysWithData).toBe(0);
  });
});
