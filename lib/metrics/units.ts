/**
 * Unit conversions for display.
 * - 1 tonne-force = 1000 kg × standard gravity g_n = 9.80665 m/s² (g_n as
 *   defined by the 3rd CGPM, 1901; SI Brochure) = 9.80665 kN.
 * - 1 knot = 1 international nautical mile (1852 m, exact) per hour
 *   = 1852/3600 m/s.
 */
export const KN_PER_TONNE_FORCE = 9.80665;
export const MS_PER_KNOT = 1852 / 3600;

export const tonneForceToKn = (tf: number): number => tf * KN_PER_TONNE_FORCE;
export const knToTonneForce = (kn: number): number => kn / KN_PER_TONNE_FORCE;
export const knotsToMs = (kt: number): number => kt * MS_PER_KNOT;
export const msToKnots = (ms: number): number => ms / MS_PER_KNOT;
