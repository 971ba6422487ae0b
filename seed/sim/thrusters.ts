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
      bus: vessel.buses.length ? i % vessel.buses.length : 0,
    };
  });
}

/**
 * Per-thruster state in typed arrays: shaft speed as a fraction of full
 * (signed), azimuth angle (rad), thrust (N, along the unit's direction) and
 * power (W). First-order speed dynamics and a rate-limited azimuth.
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
    specs.forEach((s, i) => {
      this.angle[i] = s.azimuthing ? 0 : s.fixedAngle;
      this.cos[i] = Math.cos(this.angle[i]!);
      this.sin[i] = Math.sin(this.angle[i]!);
    });
  }

  /** Shaft-speed fraction that gives thrust T (N): T = T_max·s|s|. */
  speedFor(i: number, thrust: number): number {
    const s = this.specs[i]!;
    if (thrust >= 0) return Math.sqrt(Math.min(1, thrust / s.maxThrust));
    return -Math.sqrt(Math.min(1, -thrust / s.maxReverse));
  }

  /**
   * Step toward the commanded thrust (N, signed) and angle (rad, azimuthing
   * units only). `limit` ∈ (0, 1] scales the commanded thrust of the units on
   * each bus when power is short (power.ts).
   */
  step(cmdThrust: Float64Array, cmdAngle: Float64Array, busScale: Float64Array): void {
    for (let i = 0; i < this.n; i++) {
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
      // P = P_rated (2 % + 98 % |s|³): affinity law plus a running loss (invented), rated at full speed.
      this.power[i] = s.ratedW * (0.02 + 0.98 * mag * Math.abs(sp));
    }
  }
}
