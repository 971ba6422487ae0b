import type { FleetVessel } from '../../lib/register/fleetFile';
import { DEG, RHO_WATER, wrapPi } from './constants';
import type { VesselParticulars } from './vesselModel';

/**
 * Thruster layout and dynamics for the demo simulator (demo data only).
 *
 * Propeller laws: thrust ∝ n|n|, power ∝ |n|³ (the affinity laws, e.g.
 * Fossen 2011 §9.5 / Carlton, Marine Propellers and Propulsion, ch. 6).
 * Rated thrust comes from ideal momentum (actuator-disc) theory, T =
 * (2 ρ A P²)^(1/3) (Rankine–Froude; e.g. Carlton ch. 5), derated by
 * THRUST_EFFICIENCY. Since T ∝ n² and P ∝ n³, T = η (2ρAP²)^(1/3) then holds
 * at every shaft speed, so thrust and power stay consistent with momentum
 * theory throughout.
 */

/** Fraction of ideal bollard thrust reached (common practice, no source). */
export const THRUST_EFFICIENCY = 0.7;
/**
 * Power drawn at zero thrust while running, fraction of rated: controllable-
 * pitch units turning at constant speed with zero pitch 12 %, variable-speed
 * fixed-pitch units 2 % (from memory). This is what keeps DP thrusters in
 * the 10–20 % load band in calm weather.
 */
export const CPP_IDLE = 0.12;
export const FPP_IDLE = 0.02;
/** Astern/reverse thrust of main propellers relative to ahead (from memory). */
const MAIN_ASTERN = 0.65;
/** Blade tip speed at full rpm, m/s (from memory, typical 35–40 m/s). */
const TIP_SPEED = 38;
/** Shaft speed time constant, s (common practice, no source). */
const SPEED_TAU_S = 4;
/** Azimuth slew rate, deg/s (2 rpm; from memory). */
const SLEW_DEG_S = 12;
const DEADBAND = 1 * DEG;

/** Ideal momentum theory bollard thrust, N, for shaft power P (W) and disc area A (m²). */
export function idealThrust(powerW: number, areaM2: number, rho = RHO_WATER): number {
  return Math.cbrt(2 * rho * areaM2 * powerW * powerW);
}

export type ThrusterKind = FleetVessel['thrusters'][number]['kind'];

export interface ThrusterSpec {
  id: string;
  kind: ThrusterKind;
  /** Azimuthing (azimuth and retractable units). */
  azimuthing: boolean;
  /** Fixed thrust direction relative to the bow for non-azimuthing units, rad. */
  fixedAngle: number;
  /** Position relative to midships, m (x forward, y starboard). */
  x: number;
  y: number;
  ratedW: number;
  diameter: number;
  /** Thrust at full ahead / full reverse, N. */
  maxThrust: number;
  maxReverse: number;
  /** Full shaft speed, rpm. */
  maxRpm: number;
  bus: number;
  /**
   * Controllable pitch at constant shaft speed (tunnels and main propellers in
   * this demo fleet); otherwise fixed pitch at variable speed (azimuths,
   * retractables). The control fraction s is then pitch, not speed.
   */
  cpp: boolean;
  /** Power at zero thrust while running, fraction of rated (CPP_IDLE or FPP_IDLE). */
  idle: number;
}

/** The switchboard section (index into vessel.buses) the i-th thruster draws from: round-robin (invented). */
export function busOfThruster(vessel: Pick<FleetVessel, 'buses'>, i: number): number {
  return vessel.buses.length ? i % vessel.buses.length : 0;
}

/**
 * Invented positions from the register kind and id (no real drawing): tunnels
 * named S… at the stern (x −0.42 L), other tunnels at the bow from x +0.44 L
 * aft in 0.04 L steps; retractables at +0.30 L on the centreline; mains at
 * −0.47 L, ±0.15 B; azimuths split fore/aft (±0.40 L) and spread across the
 * beam. Diameter when missing: D ≈ 0.055 √P_kW m (invented fit of the fleet's
 * figures). Thrusters go round-robin to the buses.
 */
export function thrusterLayout(vessel: FleetVessel, p: VesselParticulars): ThrusterSpec[] {
  const L = p.length, B = p.beam;
  const az = vessel.thrusters.filter((t) => t.kind === 'azimuth');
  let bow = 0, mains = 0, azi = 0;
  const mainCount = vessel.thrusters.filter((t) => t.kind === 'main').length;
  return vessel.thrusters.map((t, i) => {
    let x = 0, y = 0, fixedAngle = 0;
    const azimuthing = t.kind === 'azimuth' || t.kind === 'retractable' || t.kind === 'other';
    if (t.kind === 'tunnel') {
      fixedAngle = Math.PI / 2;
      if (/^S/i.test(t.id)) x = -0.42 * L;
      else x = (0.44 - 0.04 * bow++) * L;
    } else if (t.kind === 'main') {
      x = -0.47 * L;
      y = mainCount > 1 ? (mains++ % 2 === 0 ? -0.15 : 0.15) * B : 0;
    } else if (t.kind === 'retractable' || t.kind === 'other') {
      x = 0.3 * L;
    } else {
      const k = azi++;
      const half = Math.ceil(az.length / 2);
      const fwd = k < half;
      const j = fwd ? k : k - half;
      const count = fwd ? half : az.length - half;
      x = (fwd ? 0.4 : -0.4) * L;
      y = count > 1 ? (-0.3 + (0.6 * j) / (count - 1)) * B : 0;
    }
    const diameter = t.diameter_m ?? 0.055 * Math.sqrt(t.rated_kw);
    const area = (Math.PI * diameter * diameter) / 4;
    const maxThrust = THRUST_EFFICIENCY * idealThrust(t.rated_kw * 1000, area);
    return {
      id: t.id,
      kind: t.kind,
      azimuthing,
      fixedAngle,
      x,
      y,
      ratedW: t.rated_kw * 1000,
      diameter,
      maxThrust,
      maxReverse: t.kind === 'main' ? MAIN_ASTERN * maxThrust : t.kind === 'tunnel' ? 0.95 * maxThrust : maxThrust,
      maxRpm: (60 * TIP_SPEED) / (Math.PI * diameter),
      bus: busOfThruster(vessel, i),
      cpp: t.kind === 'tunnel' || t.kind === 'main',
      idle: t.kind === 'tunnel' || t.kind === 'main' ? CPP_IDLE : FPP_IDLE,
    };
  });
}

/**
 * Per-thruster state in typed arrays: control fraction s (shaft speed, or
 * pitch for controllable-pitch units; signed), azimuth angle (rad), thrust
 * (N, along the unit's direction) and power (W). First-order dynamics and a
 * rate-limited azimuth. A stopped unit gives no thrust and draws no power.
 *
 * Thrust T = T_max·s|s| and power P = P_rated·k·(idle + (1 − idle)|s|³): the
 * affinity laws for a fixed-pitch unit; for a controllable-pitch unit at
 * constant speed the same shape is used (common practice, no source). k is
 * the fouling factor (scenarios): a fouled unit draws k times the power for
 * the same thrust, so its thrust per power^(2/3) falls by k^(−2/3).
 */
export class ThrusterBank {
  readonly n: number;
  readonly speed: Float64Array;
  readonly angle: Float64Array;
  readonly thrust: Float64Array;
  readonly power: Float64Array;
  /** cos and sin of angle (kept in step with it). */
  readonly cos: Float64Array;
  readonly sin: Float64Array;
  /** 1 while the unit runs. */
  readonly on: Uint8Array;
  /** Starts since the counter was last cleared. */
  readonly starts: Int32Array;
  /** Power drawn for the same thrust (1 = clean; fouling scenarios raise it). */
  readonly powerFactor: Float64Array;
  private readonly alpha: number;
  private readonly slew: number;

  constructor(readonly specs: readonly ThrusterSpec[], h = 1) {
    this.n = specs.length;
    this.speed = new Float64Array(this.n);
    this.angle = new Float64Array(this.n);
    this.thrust = new Float64Array(this.n);
    this.power = new Float64Array(this.n);
    this.alpha = 1 - Math.exp(-h / SPEED_TAU_S);
    this.slew = SLEW_DEG_S * DEG * h;
    this.cos = new Float64Array(this.n);
    this.sin = new Float64Array(this.n);
    this.on = new Uint8Array(this.n).fill(1);
    this.starts = new Int32Array(this.n);
    this.powerFactor = new Float64Array(this.n).fill(1);
    specs.forEach((s, i) => {
      this.angle[i] = s.azimuthing ? 0 : s.fixedAngle;
      this.cos[i] = Math.cos(this.angle[i]!);
      this.sin[i] = Math.sin(this.angle[i]!);
    });
  }

  /** Start (counted) or stop unit i. */
  setRunning(i: number, run: boolean): void {
    if (run && !this.on[i]) {
      this.on[i] = 1;
      this.starts[i] = this.starts[i]! + 1;
    } else if (!run && this.on[i]) {
      this.on[i] = 0;
      this.speed[i] = 0;
      this.thrust[i] = 0;
      this.power[i] = 0;
    }
  }

  /** Control fraction that gives thrust T (N): T = T_max·s|s|. */
  speedFor(i: number, thrust: number): number {
    const s = this.specs[i]!;
    if (thrust >= 0) return Math.sqrt(Math.min(1, thrust / s.maxThrust));
    return -Math.sqrt(Math.min(1, -thrust / s.maxReverse));
  }

  /**
   * Step toward the commanded thrust (N, signed) and angle (rad, azimuthing
   * units only). `busScale` ∈ (0, 1] scales the commanded thrust of the units
   * on each bus when power is short (power.ts).
   */
  step(cmdThrust: Float64Array, cmdAngle: Float64Array, busScale: Float64Array): void {
    for (let i = 0; i < this.n; i++) {
      if (!this.on[i]) continue;
      const s = this.specs[i]!;
      let target = this.speedFor(i, cmdThrust[i]! * busScale[s.bus]!);
      if (s.azimuthing) {
        const rem = wrapPi(cmdAngle[i]! - this.angle[i]!);
        // Deadband of 1° before the azimuth turns (common practice, no source).
        if (rem > DEADBAND || rem < -DEADBAND) {
          const d = rem > this.slew ? this.slew : rem < -this.slew ? -this.slew : rem;
          const a = wrapPi(this.angle[i]! + d);
          this.angle[i] = a;
          this.cos[i] = Math.cos(a);
          this.sin[i] = Math.sin(a);
        }
        // Reduce thrust while more than 60° off the commanded direction (common practice, no source).
        const off = rem > this.slew ? rem - this.slew : rem < -this.slew ? -rem - this.slew : 0;
        if (off > Math.PI / 3) target *= 0.3;
      }
      const sp = this.speed[i]! + this.alpha * (target - this.speed[i]!);
      this.speed[i] = sp;
      const mag = sp * sp;
      this.thrust[i] = sp >= 0 ? s.maxThrust * mag : -s.maxReverse * mag;
      this.power[i] = s.ratedW * this.powerFactor[i]! * (s.idle + (1 - s.idle) * mag * Math.abs(sp));
    }
  }
}
