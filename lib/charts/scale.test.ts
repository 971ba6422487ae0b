import { describe, expect, it } from 'vitest';
import { niceCeil, symmetricDomain, zeroBasedDomain } from './scale';

describe('axis ranges', () => {
  it.each([
    [0.83, 1],
    [1, 1],
    [1.01, 1.2],
    [3.0000000001, 3],
    [3.2, 4],
    [7.1, 8],
    [42, 50],
    [0.013, 0.015],
  ])('niceCeil(%f) = %f', (x, nice) => expect(niceCeil(x)).toBeCloseTo(nice, 12));

  it('starts at 0 and keeps every reference line inside', () => {
    // Values to 1.9 m, watch circles at 3 and 5 m: the 5 m circle must show.
    expect(zeroBasedDomain([1.2, null, 1.9], [3, 5])).toEqual([0, 6]);
    expect(zeroBasedDomain([null, null])).toEqual([0, 1]);
  });

  it('is symmetric for offsets', () => {
    expect(symmetricDomain([-2.5, 1, 0.3], [3])).toEqual([-4, 4]);
  });
});
