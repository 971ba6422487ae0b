import { describe, expect, it } from 'vitest';
import { ewmaChart, ewmaHalfWidth } from './ewma';

// Source: NIST/SEMATECH e-Handbook of Statistical Methods, §6.3.2.4 "EWMA Control Charts",
// worked example: λ = 0.3, target 50, s = 2.0539, k = 3 (limits for large t).
const DATA = [52.0, 47.0, 53.0, 49.3, 50.1, 47.0, 51.0, 50.1, 51.2, 50.5, 49.6, 47.6, 49.9, 51.3, 47.8, 51.2, 52.6, 52.4, 53.6, 52.1];
const HANDBOOK = { lambda: 0.3, k: 3, target: 50, sigma: 2.0539 };

describe('EWMA control chart', () => {
  it('reproduces the handbook example: EWMA 50.60 … 51.99, UCL 52.5884, LCL 47.4115, no signal', () => {
    const chart = ewmaChart(DATA, { ...HANDBOOK, asymptoticLimits: true });
    expect(chart[0]!.ewma).toBeCloseTo(50.6, 2);
    expect(chart.at(-1)!.ewma).toBeCloseTo(51.99, 2);
    expect(chart[0]!.ucl).toBeCloseTo(52.5884, 4);
    // The handbook prints 47.4115; 50 − 2.58843 = 47.41157, so it truncated. 1e-4 covers both.
    expect(Math.abs(chart[0]!.lcl - 47.4115)).toBeLessThan(1e-4);
    expect(chart.every((p) => p.signal === null)).toBe(true);
  });

  // Source: J. M. Lucas and M. S. Saccucci, Technometrics 32 (1990) 1–12: Var(EWMA_t) =
  // s²·λ/(2−λ)·[1 − (1−λ)^(2t)]; at t = 1 this is (λ·s)², so the half-width is k·λ·s.
  it('starts its time-varying limits at k·λ·s and widens them to the handbook limits', () => {
    const chart = ewmaChart(DATA, HANDBOOK);
    expect(chart[0]!.ucl - 50).toBeCloseTo(3 * 0.3 * 2.0539, 10);
    for (let i = 1; i < chart.length; i++) expect(chart[i]!.ucl).toBeGreaterThan(chart[i - 1]!.ucl);
    expect(chart.at(-1)!.ucl).toBeCloseTo(52.5884, 3);
    expect(ewmaHalfWidth({ ...HANDBOOK, asymptoticLimits: true }, 1)).toBeCloseTo(2.58843, 5);
    expect(chart.every((p) => p.signal === null)).toBe(true);
  });

  it('signals a shift on the side it goes (a constructed shift of 2 s, no source)', () => {
    const shifted = ewmaChart([...DATA.slice(0, 5), ...Array(8).fill(50 + 2 * 2.0539)], HANDBOOK);
    expect(shifted.at(-1)!.signal).toBe('high');
    const down = ewmaChart(Array(8).fill(50 - 2 * 2.0539), HANDBOOK);
    expect(down.at(-1)!.signal).toBe('low');
    expect(() => ewmaChart(DATA, { ...HANDBOOK, lambda: 0 })).toThrow(RangeError);
  });
});
