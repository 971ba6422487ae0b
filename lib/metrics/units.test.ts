import { describe, expect, it } from 'vitest';
import { knToTonneForce, knotsToMs, msToKnots, tonneForceToKn } from './units';

// Source: standard gravity g_n = 9.80665 m/s² (3rd CGPM 1901, SI Brochure);
// international nautical mile = 1852 m.
describe('units', () => {
  it('1 tonne-force = 9.80665 kN', () => {
    expect(tonneForceToKn(1)).toBe(9.80665);
    expect(tonneForceToKn(100)).toBeCloseTo(980.665, 10);
    expect(knToTonneForce(9.80665)).toBe(1);
  });
  it('1 knot = 1852/3600 m/s = 0.514444… m/s', () => {
    expect(knotsToMs(1)).toBeCloseTo(0.5144444444, 10);
    expect(knotsToMs(3600)).toBeCloseTo(1852, 9);
    expect(msToKnots(1852 / 3600)).toBeCloseTo(1, 12);
  });
});
