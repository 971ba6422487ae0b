import { describe, expect, it } from 'vitest';
import { cusumChart, shiftedMean } from './cusum';

// Source: D. C. Montgomery and G. C. Runger, Applied Statistics and Probability for Engineers,
// 3rd ed. (Wiley 2003), Example 16-6 "A Tabular CUSUM", Table 16-8: chemical process
// concentration, target μ0 = 99, K = 1, H = 10. Upper: x − 100 accumulated; lower: 98 − x.
const X = [102.0, 94.8, 98.3, 98.4, 102.0, 98.5, 99.0, 97.7, 100.0, 98.1, 101.3, 98.7, 101.1, 98.4, 97.0, 96.7, 100.3, 101.4, 97.2, 101.0];
const UPPER = [2.0, 0, 0, 0, 2.0, 0.5, 0, 0, 0, 0, 1.3, 0, 1.1, 0, 0, 0, 0.3, 1.7, 0, 1.0];
const UPPER_N = [1, 0, 0, 0, 1, 2, 0, 0, 0, 0, 1, 0, 1, 0, 0, 0, 1, 2, 0];
const LOWER = [0, 3.2, 2.9, 2.5, 0, 0, 0, 0.3, 0, 0, 0, 0, 0, 0, 1.0, 2.3, 0, 0, 0.8, 0];
const LOWER_N = [0, 1, 2, 3, 0, 0, 0, 1, 0, 0, 0, 0, 0, 0, 1, 2, 0, 0, 1, 0];
const BOOK = { target: 99, k: 1, h: 10 };

describe('tabular CUSUM', () => {
  it('reproduces Table 16-8 of Montgomery and Runger: both sums, their run lengths, no signal at H = 10', () => {
    const up = cusumChart(X, { ...BOOK, side: 'upper' });
    const down = cusumChart(X, { ...BOOK, side: 'lower' });
    up.forEach((p, i) => expect(p.c).toBeCloseTo(UPPER[i]!, 9));
    down.forEach((p, i) => expect(p.c).toBeCloseTo(LOWER[i]!, 9));
    // The book prints n_H = 0 on observation 20 although s_H(20) = 1.0 > 0 (a misprint): compared up to 19.
    expect(up.slice(0, 19).map((p) => p.n)).toEqual(UPPER_N);
    expect(up[19]!.n).toBe(1);
    expect(down.map((p) => p.n)).toEqual(LOWER_N);
    expect([...up, ...down].some((p) => p.signal)).toBe(false);
  });

  it('signals a lasting shift of 2 K on the side it goes, and estimates the shifted mean (constructed, no source)', () => {
    const shifted = [...X.slice(0, 4), ...Array<number>(12).fill(101)];
    const up = cusumChart(shifted, { ...BOOK, side: 'upper' });
    // From the fifth point each adds 101 − 100 = 1: C passes 10 on the 11th of them.
    const first = up.findIndex((p) => p.signal);
    expect(first).toBe(4 + 10);
    expect(shiftedMean(up[first]!, { ...BOOK, side: 'upper' })).toBeCloseTo(101, 9);
    expect(cusumChart(shifted, { ...BOOK, side: 'lower' }).some((p) => p.signal)).toBe(false);
    expect(shiftedMean({ c: 0, n: 0 }, { ...BOOK, side: 'lower' })).toBeNull();
    expect(() => cusumChart(X, { ...BOOK, side: 'upper', h: 0 })).toThrow(RangeError);
  });
});
