/**
 * Physical constants and unit conversions shared by the demo simulator.
 * The simulator exists to make realistic demo and test data, not to control
 * anything.
 */

/** Standard gravity, m/s² (CGPM 1901, exact by definition). 1 tonne-force = 9.80665 kN. */
export const G = 9.80665;
/** kN per tonne-force (1 t = 1000 kg × 9.80665 m/s²). */
export const KN_PER_TONNE = G;
/** Sea water density, kg/m³ (from memory). */
export const RHO_WATER = 1025;
/** Air density, kg/m³ (from memory, ~15 °C at sea level). */
export const RHO_AIR = 1.226;

export const DEG = Math.PI / 180;

/** Wrap an angle in radians to (−π, π]. */
export function wrapPi(a: number): number {
  // Loops rather than % : the inner loop only ever sees angles a turn or two out.
  if (!(a > -1e3 && a < 1e3)) return Number.isFinite(a) ? Math.atan2(Math.sin(a), Math.cos(a)) : Number.NaN;
  while (a > Math.PI) a -= 2 * Math.PI;
  while (a <= -Math.PI) a += 2 * Math.PI;
  return a;
}

/** Degrees, 0 ≤ x < 360. */
export function deg360(rad: number): number {
  let d = (rad / DEG) % 360;
  if (d < 0) d += 360;
  return d >= 360 ? 0 : d;
}
