import type { FleetVessel } from '../../lib/register/fleetFile';
import { RHO_WATER } from './constants';

/**
 * 3-DOF (surge, sway, yaw) low-speed manoeuvring model of a DP vessel, after
 * T. I. Fossen, Handbook of Marine Craft Hydrodynamics and Motion Control,
 * Wiley 2011, ch. 6–7 (rigid-body + added mass, linear damping, Coriolis
 * neglected at station-keeping speeds as in the DP model of §7.3), and
 * A. J. Sørensen, "A survey of dynamic positioning control systems", Annual
 * Reviews in Control 35 (2011) 123–136 (low-frequency model, eq. 3–5).
 *
 *   η̇ = R(ψ) ν,       M ν̇ + D_L ν_r + D_Q |ν_r| ν_r = τ_thr + τ_wind + τ_wave
 *
 * η = (north, east, ψ) in the earth frame, ν = (u, v, r) in the body frame,
 * ν_r = ν − ν_current. Demo data only: this simulator makes realistic
 * telemetry, it controls nothing.
 */

export interface VesselParticulars {
  /** Length between perpendiculars, m. */
  length: number;
  beam: number;
  draught: number;
  /** Displacement, t. */
  displacementT: number;
  /** Frontal and lateral windage areas, m². */
  windFrontal: number;
  windLateral: number;
}

/**
 * Invented particulars per register `type` (no real ship; plausible for the
 * class, from memory). Unknown types get the construction-vessel figures.
 */
const PARTICULARS: Record<string, VesselParticulars> = {
  construction: { length: 130, beam: 25, draught: 7, displacementT: 12_000, windFrontal: 480, windLateral: 2_100 },
  drilling: { length: 228, beam: 42, draught: 12, displacementT: 62_000, windFrontal: 1_300, windLateral: 5_200 },
  supply: { length: 85, beam: 20, draught: 6.5, displacementT: 6_500, windFrontal: 330, windLateral: 1_000 },
  'shuttle tanker': { length: 265, beam: 46, draught: 15, displacementT: 150_000, windFrontal: 1_100, windLateral: 4_800 },
};

export function particularsFor(type: string): VesselParticulars {
  return PARTICULARS[type.trim().toLowerCase()] ?? PARTICULARS.construction!;
}

export interface VesselModel {
  p: VesselParticulars;
  /** Diagonal of M (rigid body + added mass): kg, kg, kg·m². */
  m11: number;
  m22: number;
  m33: number;
  /** Linear damping, N/(m/s), N/(m/s), N·m/(rad/s). */
  d11: number;
  d22: number;
  d33: number;
  /** Quadratic (current) drag, N/(m/s)², N/(m/s)², N·m/(rad/s)². */
  q11: number;
  q22: number;
  q33: number;
}

/**
 * Added-mass fractions (surge 5 %, sway 90 %, yaw 80 % of rigid body; from
 * memory, typical of the ratios in Fossen 2011 §6.3 for ship-shaped hulls),
 * yaw radius of gyration 0.25 L (common practice, no source). Quadratic
 * drag ½ ρ C_d A with C_d 0.6 end-on and 0.9 beam-on (from memory); linear
 * (skin-friction, low-frequency) damping set so that it equals the quadratic
 * drag at 0.1 m/s (0.005 rad/s in yaw) — it dominates only below that
 * (common practice, no source).
 */
export function vesselModel(vessel: Pick<FleetVessel, 'type'>): VesselModel {
  const p = particularsFor(vessel.type);
  const m = p.displacementT * 1000;
  const iz = m * (0.25 * p.length) ** 2;
  const m11 = 1.05 * m, m22 = 1.9 * m, m33 = 1.8 * iz;
  const side = p.length * p.draught;
  const end = p.beam * p.draught;
  const q11 = 0.5 * RHO_WATER * 0.6 * end;
  const q22 = 0.5 * RHO_WATER * 0.9 * side;
  // ∫ ½ρ C_d T |x r| x r dx over the hull ≈ ½ ρ C_d T L⁴/32 (strip theory, from memory).
  const q33 = (0.5 * RHO_WATER * 0.9 * p.draught * p.length ** 4) / 32;
  return { p, m11, m22, m33, d11: 0.1 * q11, d22: 0.1 * q22, d33: 0.005 * q33, q11, q22, q33 };
}

/** Mutable 3-DOF state: earth-frame position/heading and body-frame velocities. */
export interface VesselState {
  north: number;
  east: number;
  psi: number;
  u: number;
  v: number;
  r: number;
}

/**
 * One step of h seconds. Forces are body-frame (N, N, N·m); current is given
 * in the earth frame (m/s north, east). Semi-implicit Euler with the linear
 * damping integrated exactly (stable for h ≪ the time constants).
 */
export function stepVessel(
  s: VesselState,
  mdl: VesselModel,
  fx: number,
  fy: number,
  mz: number,
  curN: number,
  curE: number,
  h: number,
): void {
  const c = Math.cos(s.psi), sn = Math.sin(s.psi);
  // Current in the body frame.
  const uc = c * curN + sn * curE;
  const vc = -sn * curN + c * curE;
  const ur = s.u - uc, vr = s.v - vc, rr = s.r;
  const x = fx - mdl.q11 * Math.abs(ur) * ur;
  const y = fy - mdl.q22 * Math.abs(vr) * vr;
  const n = mz - mdl.q33 * Math.abs(rr) * rr;
  // M ν̇ = F − D (ν − ν_c): exact for constant F over h.
  const a1 = Math.exp((-mdl.d11 / mdl.m11) * h), a2 = Math.exp((-mdl.d22 / mdl.m22) * h), a3 = Math.exp((-mdl.d33 / mdl.m33) * h);
  s.u = uc + (ur - x / mdl.d11) * a1 + x / mdl.d11;
  s.v = vc + (vr - y / mdl.d22) * a2 + y / mdl.d22;
  s.r = rr * a3 + (n / mdl.d33) * (1 - a3);
  // Kinematics η̇ = R(ψ) ν with the updated velocities.
  s.north += (c * s.u - sn * s.v) * h;
  s.east += (sn * s.u + c * s.v) * h;
  s.psi += s.r * h;
}
