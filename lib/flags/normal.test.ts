import { describe, expect, it } from 'vitest';
import { erf, erfc, normalCdf, normalQuantile, normalUpperTail } from './normal';

describe('erf, erfc', () => {
  // Source: M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions (NBS 1964),
  // Table 7.1 "Error function" (erf x to 10 decimals).
  it.each([
    [0.5, 0.5204998778],
    [1.0, 0.8427007929],
    [1.5, 0.9661051465],
    [2.0, 0.995322265],
  ])('erf(%s) = %s as tabulated', (x, value) => {
    expect(erf(x)).toBeCloseTo(value, 10);
    expect(erf(-x)).toBeCloseTo(-value, 10);
  });

  // Source: Abramowitz and Stegun Table 7.1 gives erfc only to x = 2; the tail values below are
  // from memory (the standard values, e.g. erfc 3 = 2.209 049 699 858 544e−5) and checked against
  // the C library's erfc through Python's math.erfc on this machine. Relative error, since the
  // point of erfc is the tiny tail.
  it.each([
    [3, 2.209049699858544e-5],
    [4, 1.541725790028002e-8],
    [5, 1.537459794428035e-12],
    [6, 2.151973671249892e-17],
  ])('erfc(%s) = %s to 1e-12 relative', (x, value) => {
    expect(Math.abs(erfc(x) / value - 1)).toBeLessThan(1e-12);
  });

  // Source: Abramowitz and Stegun eq. 7.1.19, d erf z/dz = (2/√π)·e^(−z²): across the switch from
  // the series to the continued fraction at x = 3 the difference quotient must match it.
  it('joins the series and the continued fraction smoothly at x = 3', () => {
    const h = 1e-4;
    const slope = (erfc(3 - h) - erfc(3 + h)) / (2 * h);
    expect(slope / ((2 / Math.sqrt(Math.PI)) * Math.exp(-9)) - 1).toBeCloseTo(0, 5);
  });
});

describe('normal distribution', () => {
  // Source: Abramowitz and Stegun Table 26.1 "Normal probability function" P(x).
  it.each([
    [1, 0.841344746068543],
    [2, 0.977249868051821],
    [3, 0.99865010196837],
  ])('Φ(%s) = %s', (z, p) => {
    expect(normalCdf(z)).toBeCloseTo(p, 12);
    expect(normalCdf(-z)).toBeCloseTo(1 - p, 12);
  });

  // Source: the usual two-sided critical values, e.g. NIST/SEMATECH e-Handbook §1.3.6.7.1
  // (z = 1.96 for 95 %, 2.576 for 99 %).
  it('inverts Φ at the usual critical values', () => {
    expect(normalQuantile(0.975)).toBeCloseTo(1.959964, 6);
    expect(normalQuantile(0.995)).toBeCloseTo(2.575829, 6);
    expect(normalQuantile(0.5)).toBeCloseTo(0, 12);
    expect(() => normalQuantile(1)).toThrow(RangeError);
  });

  it('keeps the upper tail without cancellation (Q(8) ≈ 6.22e−16, from memory; 1 − Φ(8) would round to 0)', () => {
    expect(normalUpperTail(8)).toBeGreaterThan(6.2e-16);
    expect(normalUpperTail(8)).toBeLessThan(6.25e-16);
  });
});
