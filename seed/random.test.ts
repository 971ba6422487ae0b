import { describe, expect, it } from 'vitest';
import { Random, seedOf } from './random';

describe('Random', () => {
  it('repeats for the same seed', () => {
    const a = new Random(42);
    const b = new Random(42);
    expect(Array.from({ length: 5 }, () => a.next())).toEqual(Array.from({ length: 5 }, () => b.next()));
  });

  it('gives standard normal deviates (mean ≈ 0, variance ≈ 1 over 200,000 draws)', () => {
    const r = new Random(seedOf('normal-check'));
    const n = 200_000;
    let sum = 0;
    let sq = 0;
    for (let i = 0; i < n; i++) {
      const x = r.normal();
      sum += x;
      sq += x * x;
    }
    const mean = sum / n;
    // Standard error of the mean is 1/sqrt(n) ≈ 0.0022; allow 4 of them.
    expect(Math.abs(mean)).toBeLessThan(0.009);
    expect(Math.abs(sq / n - mean * mean - 1)).toBeLessThan(0.02);
  });
});
