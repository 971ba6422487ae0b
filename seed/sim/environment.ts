import { Random } from '../random';
import { DEG, G, RHO_AIR, RHO_WATER } from './constants';
import type { VesselModel } from './vesselModel';

/**
 * Environment for the demo simulator (realistic demo data only, controls
 * nothing): wind, current and wave drift.
 *
 * - Mean wind: a weather pattern varying over days (two sinusoids of 3.1 d and
 *   1 d plus a slow first-order Gauss–Markov wander; invented shape).
 * - Gusts: first-order Gauss–Markov process (Fossen 2011 §8.1.3; Sørensen 2011
 *   §2.2) with time constant GUST_TAU_S and standard deviation TURBULENCE ×
 *   mean speed (turbulence intensity ~12 %, from memory).
 * - Wind loads: Fossen 2011 §8.1, eq. 8.24 with the simple coefficient shapes
 *   C_X = −c_x cos γ, C_Y = c_y sin γ, C_N = c_n sin 2γ (γ angle of the wind
 *   relative to the bow; c_x 0.7, c_y 0.85, c_n 0.1 from memory).
 * - Current: slowly varying speed and set (Gauss–Markov, τ 3 h; set 135° from
 *   the prevailing wind direction ± a 12 h wander) plus an M2 tidal stream of
 *   period 12.42 h along the wind axis (invented amplitudes and directions).
 * - Wave drift: mean second-order force ∝ H_s² (Faltinsen, Sea Loads on Ships
 *   and Offshore Structures, 1990, ch. 5: F̄ ~ ½ ρ g ζ² L per unit reflection),
 *   H_s from the fully developed Pierson–Moskowitz relation H_s ≈ 0.21 U²/g
 *   (from memory) capped at 6 m (DP work stops well before; invented), plus a slowly varying part (Gauss–Markov,
 *   τ 100 s, 30 % of the mean; invented).
 */

export const GUST_TAU_S = 40; // from memory: gust time scales of tens of seconds
export const TURBULENCE = 0.12;
const CX = 0.7, CY = 0.85, CN = 0.1;
const SLOW_S = 10;
const REFLECTION = 0.15; // fraction of the ideal wall drift force (invented)

/** Discrete first-order Gauss–Markov: x ← a x + σ √(1−a²) w, stationary sd σ. */
export class GaussMarkov {
  private readonly a: number;
  private readonly k: number;
  x = 0;
  constructor(tauS: number, sd: number, h = 1) {
    this.a = Math.exp(-h / tauS);
    this.k = Math.sqrt(1 - this.a * this.a) * sd;
  }
  step(rng: Random): number {
    this.x = this.a * this.x + this.k * rng.normal();
    return this.x;
  }
}

export interface EnvSample {
  /** Wind speed (m/s) and the direction it comes from (rad, earth frame). */
  windSpeed: number;
  windFrom: number;
  /** Current velocity, m/s north/east (the direction it sets towards). */
  curN: number;
  curE: number;
  /** Significant wave height, m, waves coming from windFrom. */
  hs: number;
  /** Slowly varying wave-drift factor (1 = mean). */
  driftFactor: number;
}

export class Environment {
  private readonly gust = new GaussMarkov(GUST_TAU_S, 1);
  // Processes with time constants of hours step every SLOW_S seconds (same statistics, fewer deviates).
  private readonly windWander = new GaussMarkov(6 * 3600, 1.5, SLOW_S);
  private readonly dirWander = new GaussMarkov(8 * 3600, 25 * DEG, SLOW_S);
  private readonly curWander = new GaussMarkov(3 * 3600, 0.12, SLOW_S);
  private readonly curDir = new GaussMarkov(12 * 3600, 30 * DEG, SLOW_S);
  private readonly drift = new GaussMarkov(100, 0.3);
  private readonly phase: number;
  readonly sample: EnvSample = { windSpeed: 0, windFrom: 0, curN: 0, curE: 0, hs: 0, driftFactor: 1 };
  /** Multiplies the mean wind (and so the sea state): the weather-only scenario raises it. */
  windScale = 1;
  /** A steady current (m/s north, east) instead of the varying one (tests). */
  steadyCurrent?: { north: number; east: number };
  /** Mean wind before windScale, m/s, and whether the slow part has been computed yet. */
  private mean = 0;
  private slowReady = false;
  private readonly fromCos: number;
  private readonly fromSin: number;

  /**
   * @param meanFrom prevailing wind direction, rad (the demo heads vessels into it)
   * @param fixedWind when set, a steady mean wind (m/s) with gusts only (tests)
   */
  constructor(
    private readonly rng: Random,
    private readonly meanFrom: number,
    private readonly fixedWind?: number,
    private readonly fixedCurrent = false,
  ) {
    this.phase = rng.next() * 2 * Math.PI;
    this.fromCos = Math.cos(meanFrom);
    this.fromSin = Math.sin(meanFrom);
  }

  /** Advance one second to time tS (seconds since the epoch). */
  step(tS: number): EnvSample {
    const s = this.sample;
    // What varies over hours (mean wind, current, tide) is updated every SLOW_S seconds: the same
    // statistics for a fraction of the sines.
    if (tS % SLOW_S === 0 || !this.slowReady) {
      if (tS % SLOW_S === 0) {
        this.windWander.step(this.rng);
        this.dirWander.step(this.rng);
        this.curWander.step(this.rng);
        this.curDir.step(this.rng);
      }
      this.slowStep(tS);
    }
    const mean = this.mean * this.windScale;
    const w = mean * (1 + TURBULENCE * this.gust.step(this.rng));
    s.windSpeed = w > 0 ? w : 0;
    const hs = (0.21 * mean * mean) / G;
    s.hs = hs > 6 ? 6 : hs;
    s.driftFactor = 1 + this.drift.step(this.rng);
    return s;
  }

  private slowStep(tS: number): void {
    const s = this.sample;
    this.slowReady = true;
    if (this.fixedWind !== undefined) {
      this.mean = this.fixedWind;
      s.windFrom = this.meanFrom;
    } else {
      const days = tS / 86_400;
      const mean = 8 + 5 * Math.sin(2 * Math.PI * (days / 3.1) + this.phase) + 2 * Math.sin(2 * Math.PI * days + 2 * this.phase) + this.windWander.x;
      this.mean = mean < 0.5 ? 0.5 : mean;
      s.windFrom = this.meanFrom + this.dirWander.x;
    }
    if (this.steadyCurrent) {
      s.curN = this.steadyCurrent.north;
      s.curE = this.steadyCurrent.east;
    } else if (this.fixedCurrent) {
      s.curN = 0;
      s.curE = 0;
    } else {
      const tide = 0.25 * Math.sin((2 * Math.PI * tS) / (12.42 * 3600) + this.phase);
      const speed = Math.abs(0.2 + this.curWander.x);
      const set = this.meanFrom + (3 * Math.PI) / 4 + this.curDir.x;
      s.curN = speed * Math.cos(set) + tide * this.fromCos;
      s.curE = speed * Math.sin(set) + tide * this.fromSin;
    }
  }
}

/**
 * Wind force in the body frame (N, N, N·m) on a vessel with heading psi, for
 * wind of speed (m/s) coming from `from` (rad). Writes into out[0..2].
 * Fossen 2011 eq. 8.24 with relative wind = wind (vessel nearly stationary).
 */
export function windForce(mdl: VesselModel, psi: number, speed: number, from: number, out: Float64Array, scale = 1): void {
  const gamma = from - psi; // 0 = wind on the bow
  windForceAt(mdl, Math.cos(gamma), Math.sin(gamma), speed, out, scale);
}

/** windForce with the cosine and sine of the wind's angle off the bow given. */
function windForceAt(mdl: VesselModel, cg: number, sg: number, speed: number, out: Float64Array, scale: number): void {
  const q = 0.5 * RHO_AIR * speed * speed * scale;
  out[0] = -CX * cg * q * mdl.p.windFrontal;
  out[1] = -CY * sg * q * mdl.p.windLateral;
  out[2] = -CN * 2 * sg * cg * q * mdl.p.windLateral * mdl.p.length; // sin 2γ = 2 sin γ cos γ
}

/** Wave drift force in the body frame for waves from `from` (rad). Adds into out. */
export function waveDriftForce(mdl: VesselModel, psi: number, hs: number, from: number, factor: number, out: Float64Array): void {
  const gamma = from - psi;
  waveDriftAt(mdl, Math.cos(gamma), Math.sin(gamma), hs, factor, out);
}

function waveDriftAt(mdl: VesselModel, cg: number, sg: number, hs: number, factor: number, out: Float64Array): void {
  // ζ ≈ H_s/4 (the standard deviation of the surface elevation).
  const perLength = 0.5 * RHO_WATER * G * (hs / 4) * (hs / 4) * REFLECTION * factor;
  out[0] = out[0]! - cg * perLength * mdl.p.beam;
  out[1] = out[1]! - sg * perLength * mdl.p.length;
  out[2] = out[2]! - 0.05 * 2 * sg * cg * perLength * mdl.p.length * mdl.p.length;
}

/** Wind and wave drift together (waves come from the wind's direction): one cosine and sine for both. */
export function environmentForce(mdl: VesselModel, psi: number, env: EnvSample, out: Float64Array): void {
  const gamma = env.windFrom - psi;
  const cg = Math.cos(gamma), sg = Math.sin(gamma);
  windForceAt(mdl, cg, sg, env.windSpeed, out, 1);
  waveDriftAt(mdl, cg, sg, env.hs, env.driftFactor, out);
}
