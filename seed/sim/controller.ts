import { KN_PER_TONNE } from './constants';
import type { VesselModel } from './vesselModel';

/**
 * DP controller for the demo simulator (demo data only): a PID per body axis
 * (surge, sway, yaw) on the estimated position/heading error, plus wind
 * feed-forward (Sørensen 2011 §4.2–4.3, eq. 25; Fossen 2011 §12.2.8). Gains
 * by pole placement on the low-frequency model: K_p = M ω², K_d = 2ζMω − D,
 * K_i = K_p ω / 10, with natural periods 100 s (surge, sway) and 80 s (yaw)
 * and ζ = 0.8 (common practice, no source). DP consoles show the position gain
 * in tonnes per metre; 1 t = 9.80665 kN.
 */

/** Proportional demand in tonnes for a gain in t/m and an error in m (opposes the error). */
export function proportionalDemandT(gainTPerM: number, errorM: number): number {
  return -gainTPerM * errorM;
}

export interface AxisGains {
  /** N/m (or N·m/rad), N/(m/s), N/(m·s). */
  kp: number;
  kd: number;
  ki: number;
  /** Integral clamp, N. */
  iMax: number;
}

export function gainsFor(mass: number, damping: number, periodS: number, zeta = 0.8, iMax = Infinity): AxisGains {
  const w = (2 * Math.PI) / periodS;
  const kp = mass * w * w;
  return { kp, kd: Math.max(0, 2 * zeta * mass * w - damping), ki: (kp * w) / 10, iMax };
}

export class Pid {
  integral = 0;
  /** Multiplies all three gains (1 = as tuned; a detuned controller or an operator's joystick is softer). */
  scale = 1;
  constructor(readonly g: AxisGains) {}

  /** Demand (N) for error e (m) and rate (m/s), over a step of h s. */
  demand(e: number, rate: number, h: number): number {
    const k = this.scale;
    let i = this.integral + k * this.g.ki * e * h;
    if (i > this.g.iMax) i = this.g.iMax;
    else if (i < -this.g.iMax) i = -this.g.iMax;
    this.integral = i;
    return -(k * (this.g.kp * e + this.g.kd * rate) + i);
  }

  /** The position gain in tonnes per metre. */
  get kpTonnesPerMetre(): number {
    return this.g.kp / (1000 * KN_PER_TONNE);
  }
}

export class DpController {
  readonly surge: Pid;
  readonly sway: Pid;
  readonly yaw: Pid;
  /** Last demand, body frame (N, N, N·m). */
  readonly tau = new Float64Array(3);

  /** Demand limits per axis (N, N, N·m): the allocation's capacity. */
  readonly limit: Float64Array;

  /**
   * @param capacity the thrust allocation's pure surge, sway and yaw capacity.
   * Natural periods are lengthened where needed so that a 2 m (2°) error asks
   * for at most half the capacity (common practice, no source), and the
   * integral is clamped to 80 % of it.
   */
  constructor(mdl: VesselModel, capacity: readonly [number, number, number]) {
    const period = (m: number, base: number, cap: number, err: number) => Math.max(base, 2 * Math.PI * Math.sqrt((m * err) / (0.5 * cap)));
    this.surge = new Pid(gainsFor(mdl.m11, mdl.d11, period(mdl.m11, 100, capacity[0], 2), 0.8, 0.8 * capacity[0]));
    this.sway = new Pid(gainsFor(mdl.m22, mdl.d22, period(mdl.m22, 100, capacity[1], 2), 0.8, 0.8 * capacity[1]));
    this.yaw = new Pid(gainsFor(mdl.m33, mdl.d33, period(mdl.m33, 80, capacity[2], 2 * (Math.PI / 180)), 0.8, 0.8 * capacity[2]));
    this.limit = Float64Array.from(capacity);
  }

  /** Gain multipliers: surge and sway, and yaw. */
  setGainScale(position: number, yaw: number): void {
    this.surge.scale = position;
    this.sway.scale = position;
    this.yaw.scale = yaw;
  }

  /** Forget the integral action (a new approach to the set point). */
  reset(): void {
    this.surge.integral = this.sway.integral = this.yaw.integral = 0;
  }

  /**
   * eN, eE: estimated position minus set point (m, earth); eYaw (rad);
   * u, v, r: estimated body velocities relative to the set point's motion;
   * ff: wind feed-forward (body, added).
   */
  step(eN: number, eE: number, eYaw: number, psi: number, u: number, v: number, r: number, ffX: number, ffY: number, ffN: number, h: number): Float64Array {
    const c = Math.cos(psi), s = Math.sin(psi);
    const ex = c * eN + s * eE;
    const ey = -s * eN + c * eE;
    this.tau[0] = clamp(this.surge.demand(ex, u, h) + ffX, this.limit[0]!);
    this.tau[1] = clamp(this.sway.demand(ey, v, h) + ffY, this.limit[1]!);
    this.tau[2] = clamp(this.yaw.demand(eYaw, r, h) + ffN, this.limit[2]!);
    return this.tau;
  }
}

function clamp(x: number, lim: number): number {
  return x > lim ? lim : x < -lim ? -lim : x;
}
