import { describe, expect, it } from 'vitest';
import { mannKendall } from './mannKendall';
import { senSlope } from './senSlope';

// Source: formulas of R. O. Gilbert, Statistical Methods for Environmental Pollution Monitoring
// (1987), §16.4–16.5, pp. 209–219; data and S, Var(S), Z from a public hand-worked Mann–Kendall
// teaching note (as quoted in issue 6). Sen's slope 0.5667 is computed (median of the 91
// pairwise slopes), not taken from the note.
const EXAMPLE = [12.9, 14.8, 13.2, 15.7, 13.8, 15.6, 12.9, 11.0, 17.3, 15.9, 19.0, 18.3, 20.1, 21.7];

describe('Mann–Kendall test', () => {
  it('gives S = 54, Var(S) = 332.667, Z = 2.9058 on the worked example (one tie: 12.9 twice)', () => {
    const r = mannKendall(EXAMPLE)!;
    expect(r.n).toBe(14);
    expect(r.s).toBe(54);
    expect(r.varS).toBeCloseTo(332.667, 3);
    expect(r.z).toBeCloseTo(2.9058, 4);
    // p from Φ: one-sided 1 − Φ(2.9058) ≈ 0.00183 (A&S Table 26.1 interpolated), two-sided twice that.
    expect(r.pIncreasing).toBeCloseTo(0.00183, 5);
    expect(r.pTwoSided).toBeCloseTo(2 * r.pIncreasing, 12);
    expect(r.pDecreasing).toBeCloseTo(1 - r.pIncreasing, 12);
  });

  it('without the tie correction Var(S) would be 333.667 (Gilbert eq. 16.4 with no ties): the correction is applied', () => {
    const noTie = EXAMPLE.map((x, i) => (i === 6 ? 12.95 : x));
    expect(mannKendall(noTie)!.varS).toBeCloseTo(333.667, 3);
  });

  it('applies the continuity correction on both sides and gives Z = 0 at S = 0 (Gilbert eq. 16.5)', () => {
    const down = mannKendall([...EXAMPLE].reverse())!;
    expect(down.s).toBe(-54);
    expect(down.z).toBeCloseTo(-2.9058, 4);
    expect(mannKendall([1, 3, 2, 2, 3, 1])!.z).toBe(0);
    expect(mannKendall([5, 5, 5, 5])!.z).toBe(0);
    expect(mannKendall([1, 2])).toBeNull();
  });

  it("gives Sen's slope 0.5667 on the same data (computed) with a 95 % interval around it", () => {
    const r = mannKendall(EXAMPLE)!;
    const sen = senSlope(EXAMPLE.map((_, i) => i + 1), EXAMPLE, r.varS)!;
    expect(sen.pairs).toBe(91);
    expect(sen.slope).toBeCloseTo(0.5667, 4);
    expect(sen.lower).toBeGreaterThan(0);
    expect(sen.lower).toBeLessThan(sen.slope);
    expect(sen.upper).toBeGreaterThan(sen.slope);
  });
});
