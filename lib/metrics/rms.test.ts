import { describe, expect, it } from 'vitest';
import { maxOf, mergeRms } from './rms';

// Source: docs spec metrics-v1: r_rms = sqrt(Σ n·r_rms² / Σ n); r_max = max.
describe('mergeRms', () => {
  it('weights each interval by its samples: sqrt((2·1² + 2·3²)/4) = √5', () => {
    expect(mergeRms([{ n: 2, rms: 1 }, { n: 2, rms: 3 }])).toBeCloseTo(Math.sqrt(5), 12);
    // unequal n: sqrt((1·4 + 3·0)/4) = 1
    expect(mergeRms([{ n: 1, rms: 2 }, { n: 3, rms: 0 }])).toBeCloseTo(1, 12);
  });

  it('equals the RMS of the pooled samples', () => {
    const a = [1, 2, 3];
    const b = [4, 5];
    const rms = (xs: number[]) => Math.sqrt(xs.reduce((s, x) => s + x * x, 0) / xs.length);
    expect(mergeRms([{ n: 3, rms: rms(a) }, { n: 2, rms: rms(b) }])).toBeCloseTo(rms([...a, ...b]), 12);
  });

  it('skips intervals without an RMS and is null when Σ n = 0', () => {
    expect(mergeRms([{ n: 5, rms: undefined }, { n: 2, rms: 2 }])).toBe(2);
    expect(mergeRms([])).toBeNull();
    expect(mergeRms([{ n: 0, rms: 1 }])).toBeNull();
    expect(mergeRms([{ n: 4, rms: null }])).toBeNull();
  });
});

describe('maxOf', () => {
  it('is the largest value sent, null when none', () => {
    expect(maxOf([1, undefined, 7, null, 3])).toBe(7);
    expect(maxOf([undefined, null])).toBeNull();
    expect(maxOf([0])).toBe(0);
  });
});
