/**
 * Thruster efficiency index and ideal momentum theory.
 *
 * Source: docs spec metrics-v1 "Thruster wear": efficiency_index =
 * Σ(thrust_kn·run_s) / Σ(power_kw^(2/3)·run_s) over the day's intervals with
 * run_s > 0 and power_kw > 0, in kN/kW^(2/3); at bollard conditions ideal
 * momentum theory gives T = (2·ρ·A·P²)^(1/3).
 *
 * Ideal momentum (actuator disc) theory at zero advance speed, derived here:
 * the disc of area A accelerates water from rest to the far-wake speed w;
 * at the disc the speed is w/2. Mass flow ṁ = ρ·A·w/2, thrust T = ṁ·w =
 * ρ·A·w²/2, power P = ṁ·w²/2 = ρ·A·w³/4. From T: w = sqrt(2T/(ρA)), so
 * P = (ρA/4)·(2T/(ρA))^(3/2) = T^(3/2) / sqrt(2ρA), i.e.
 *   P = sqrt(T³ / (2ρA))   and   T = (2ρA·P²)^(1/3).
 * In kN and kW with A = πD²/4: T[N] = (2ρA)^(1/3) · (1000·P[kW])^(2/3), and
 * 1000^(2/3) = 100, so T[kN] = 0.1 · (ρπ/2)^(1/3) · (D·P[kW])^(2/3);
 * for ρ = 1025 kg/m³, (1025·π/2)^(1/3) = 11.72055…, so
 *   T[kN] ≈ 1.1721 · (D[m] · P[kW])^(2/3).
 * Real thrusters reach a fraction of the ideal (the figure of merit); the
 * index tracks the ratio, which should stay constant for a healthy unit.
 *
 * Choice the spec leaves open: an interval that sends power_kw but not
 * thrust_kn is skipped (both sums need both fields); no qualifying interval
 * → null.
 */

export const SEAWATER_DENSITY = 1025; // kg/m³, the value the spec's check uses

export interface EfficiencyInterval {
  run_s: number;
  thrust_kn?: number | null;
  power_kw?: number | null;
}

export function efficiencyIndex(intervals: Iterable<EfficiencyInterval>): number | null {
  let num = 0;
  let den = 0;
  let any = false;
  for (const u of intervals) {
    if (!(u.run_s > 0) || u.power_kw == null || !(u.power_kw > 0) || u.thrust_kn == null) continue;
    num += u.thrust_kn * u.run_s;
    den += u.power_kw ** (2 / 3) * u.run_s;
    any = true;
  }
  return any ? num / den : null;
}

const diskArea = (diameterM: number) => (Math.PI * diameterM * diameterM) / 4;

/** Ideal bollard thrust, N, from shaft power P (W): T = (2ρA·P²)^(1/3). */
export function idealThrustN(powerW: number, diameterM: number, rho = SEAWATER_DENSITY): number {
  return Math.cbrt(2 * rho * diskArea(diameterM) * powerW * powerW);
}

/** Ideal bollard power, W, for thrust T (N): P = sqrt(T³ / (2ρA)). */
export function idealPowerW(thrustN: number, diameterM: number, rho = SEAWATER_DENSITY): number {
  return Math.sqrt(thrustN ** 3 / (2 * rho * diskArea(diameterM)));
}

/** Coefficient c in T[kN] = c·(D[m]·P[kW])^(2/3): c = 0.1·(ρπ/2)^(1/3) (1.1721 for ρ = 1025). */
export function idealThrustCoefficient(rho = SEAWATER_DENSITY): number {
  return 0.1 * Math.cbrt((rho * Math.PI) / 2);
}
