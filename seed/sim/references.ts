import type { FleetVessel } from '../../lib/register/fleetFile';
import { Random } from '../random';

/**
 * Position reference systems for the demo simulator (demo data only): each
 * measures the true position with white noise plus a slowly wandering
 * (first-order Gauss–Markov) error, drops out now and then, and occasionally
 * jumps (GNSS multipath, acoustic outliers). The DP system weights the
 * accepted systems by the inverse of their estimated variance (the minimum-
 * variance combination of independent measurements; e.g. Sørensen 2011 §3.2,
 * Fossen 2011 §11.3.4) and rejects one whose residual exceeds REJECT_SIGMAS
 * standard deviations (a prediction-error test; common practice, no source).
 *
 * Noise figures per kind (total 1-σ per axis, m): from memory, typical
 * working figures; dropout and glitch rates are invented.
 */

type Kind = FleetVessel['refs'][number]['kind'];

interface KindFigures {
  whiteSd: number;
  wanderSd: number;
  wanderTauS: number;
  /** Mean time between dropouts and mean outage, s. */
  mtbfS: number;
  outageS: number;
  /** Chance per second of a glitch, its size (m) and mean duration (s). */
  glitchRate: number;
  glitchM: number;
  glitchS: number;
}

export const REF_FIGURES: Record<Kind, KindFigures> = {
  gnss: { whiteSd: 0.15, wanderSd: 0.3, wanderTauS: 300, mtbfS: 86_400, outageS: 90, glitchRate: 1 / 172_800, glitchM: 6, glitchS: 40 },
  hydroacoustic: { whiteSd: 0.55, wanderSd: 0.2, wanderTauS: 120, mtbfS: 21_600, outageS: 120, glitchRate: 1 / 3_600, glitchM: 8, glitchS: 1 },
  laser: { whiteSd: 0.1, wanderSd: 0.05, wanderTauS: 60, mtbfS: 28_800, outageS: 300, glitchRate: 1 / 86_400, glitchM: 5, glitchS: 5 },
  radar: { whiteSd: 0.4, wanderSd: 0.2, wanderTauS: 120, mtbfS: 43_200, outageS: 200, glitchRate: 1 / 86_400, glitchM: 6, glitchS: 10 },
  taut_wire: { whiteSd: 0.2, wanderSd: 0.15, wanderTauS: 200, mtbfS: 172_800, outageS: 900, glitchRate: 0, glitchM: 0, glitchS: 1 },
  other: { whiteSd: 0.4, wanderSd: 0.2, wanderTauS: 120, mtbfS: 43_200, outageS: 200, glitchRate: 1 / 86_400, glitchM: 5, glitchS: 10 },
};

export const REJECT_SIGMAS = 4;
const WANDER_STEP_S = 5;
/** Forgetting time of the DP's running variance estimate per system, s (common practice, no source). */
const VARIANCE_TAU_S = 300;

/** Inverse-variance weights w_i = (1/σ_i²) / Σ (1/σ_j²) of the given variances (0 weight for NaN/absent). */
export function inverseVarianceWeights(variances: ArrayLike<number>, out: Float64Array = new Float64Array(variances.length)): Float64Array {
  let sum = 0;
  for (let i = 0; i < variances.length; i++) {
    const v = variances[i]!;
    out[i] = v > 0 ? 1 / v : 0;
    sum += out[i]!;
  }
  for (let i = 0; i < variances.length; i++) out[i] = sum > 0 ? out[i]! / sum : 0;
  return out;
}

export class ReferenceSystems {
  readonly n: number;
  readonly kinds: Kind[];
  readonly ids: string[];
  private readonly fig: KindFigures[];
  private readonly gmA: Float64Array;
  private readonly gmK: Float64Array;
  private readonly wanderN: Float64Array;
  private readonly wanderE: Float64Array;
  private readonly offlineUntil: Float64Array;
  /** Next scheduled dropout and glitch (exponential inter-arrival times; NaN = not yet drawn). */
  private readonly nextDrop: Float64Array;
  private readonly nextGlitch: Float64Array;
  private readonly glitchUntil: Float64Array;
  private readonly glitchN: Float64Array;
  private readonly glitchE: Float64Array;
  /** The DP's running variance estimate per system (per axis), m². */
  readonly variance: Float64Array;
  /** Noise multiplier per system (1 = its kind's figures; scenarios raise it). */
  readonly noiseScale: Float64Array;
  readonly measN: Float64Array;
  readonly measE: Float64Array;
  readonly valid: Uint8Array;
  readonly accepted: Uint8Array;
  readonly weight: Float64Array;
  private readonly wasRejected: Uint8Array;
  private readonly inv: Float64Array;
  /** Fused measurement of the last step and its variance (NaN when none). */
  fusedN = 0;
  fusedE = 0;
  fusedVar = Number.NaN;
  // Interval accumulators.
  readonly onlineS: Float64Array;
  readonly weightSum: Float64Array;
  readonly resN: Float64Array;
  readonly resE: Float64Array;
  readonly resN2: Float64Array;
  readonly resE2: Float64Array;
  readonly resCount: Float64Array;
  readonly rejected: Int32Array;

  constructor(vessel: Pick<FleetVessel, 'refs'>, private readonly rng: Random, private readonly dropouts = true) {
    this.n = vessel.refs.length;
    this.kinds = vessel.refs.map((r) => r.kind);
    this.ids = vessel.refs.map((r) => r.id);
    this.fig = this.kinds.map((k) => REF_FIGURES[k]);
    const f64 = () => new Float64Array(this.n);
    // The wander steps every WANDER_STEP_S seconds (time constants of minutes: same statistics, fewer deviates).
    this.gmA = Float64Array.from(this.fig.map((f) => Math.exp(-WANDER_STEP_S / f.wanderTauS)));
    this.gmK = Float64Array.from(this.fig.map((f, i) => Math.sqrt(1 - this.gmA[i]! ** 2) * f.wanderSd));
    this.wanderN = f64();
    this.wanderE = f64();
    this.offlineUntil = f64();
    this.nextDrop = new Float64Array(this.n).fill(Number.NaN);
    this.nextGlitch = new Float64Array(this.n).fill(Number.NaN);
    this.glitchUntil = f64();
    this.glitchN = f64();
    this.glitchE = f64();
    this.variance = Float64Array.from(this.fig.map((f) => f.whiteSd ** 2 + f.wanderSd ** 2));
    this.noiseScale = new Float64Array(this.n).fill(1);
    this.measN = f64();
    this.measE = f64();
    this.valid = new Uint8Array(this.n);
    this.accepted = new Uint8Array(this.n);
    this.weight = f64();
    this.wasRejected = new Uint8Array(this.n);
    this.inv = f64();
    this.onlineS = f64();
    this.weightSum = f64();
    this.resN = f64();
    this.resE = f64();
    this.resN2 = f64();
    this.resE2 = f64();
    this.resCount = f64();
    this.rejected = new Int32Array(this.n);
  }

  /** Measure the true position at time tS, test against the predicted estimate (estN, estE, with variance estVar) and fuse. */
  step(tS: number, trueN: number, trueE: number, estN: number, estE: number, estVar: number): void {
    const rng = this.rng;
    let invSum = 0, zN = 0, zE = 0;
    const wander = tS % WANDER_STEP_S === 0;
    for (let i = 0; i < this.n; i++) {
      const f = this.fig[i]!;
      if (wander) {
        this.wanderN[i] = this.gmA[i]! * this.wanderN[i]! + this.gmK[i]! * rng.normal();
        this.wanderE[i] = this.gmA[i]! * this.wanderE[i]! + this.gmK[i]! * rng.normal();
      }
      if (this.dropouts) {
        // Poisson arrivals: draw the time of the next event instead of a coin per second.
        if (this.nextDrop[i] !== this.nextDrop[i]) this.nextDrop[i] = tS - f.mtbfS * Math.log(1 - rng.next());
        if (tS >= this.nextDrop[i]!) {
          this.offlineUntil[i] = tS + 1 - f.outageS * Math.log(1 - rng.next());
          this.nextDrop[i] = this.offlineUntil[i]! - f.mtbfS * Math.log(1 - rng.next());
        }
      }
      this.valid[i] = tS >= this.offlineUntil[i]! ? 1 : 0;
      this.accepted[i] = 0;
      this.inv[i] = 0;
      if (!this.valid[i]) continue;
      if (this.dropouts && f.glitchRate > 0 && this.nextGlitch[i] !== this.nextGlitch[i]) this.nextGlitch[i] = tS - Math.log(1 - rng.next()) / f.glitchRate;
      if (this.dropouts && tS >= this.nextGlitch[i]!) {
        const a = rng.next() * 2 * Math.PI;
        this.glitchN[i] = f.glitchM * Math.cos(a);
        this.glitchE[i] = f.glitchM * Math.sin(a);
        this.glitchUntil[i] = tS + Math.max(1, -f.glitchS * Math.log(1 - rng.next()));
        this.nextGlitch[i] = this.glitchUntil[i]! - Math.log(1 - rng.next()) / f.glitchRate;
      }
      const g = tS < this.glitchUntil[i]! ? 1 : 0;
      const k = this.noiseScale[i]!;
      const mN = trueN + k * (this.wanderN[i]! + f.whiteSd * rng.normal()) + g * this.glitchN[i]!;
      const mE = trueE + k * (this.wanderE[i]! + f.whiteSd * rng.normal()) + g * this.glitchE[i]!;
      this.measN[i] = mN;
      this.measE[i] = mE;
      const rN = mN - estN, rE = mE - estE;
      const gate = REJECT_SIGMAS * REJECT_SIGMAS * (this.variance[i]! + estVar);
      if (rN * rN > gate || rE * rE > gate) {
        if (!this.wasRejected[i]) this.rejected[i] = this.rejected[i]! + 1;
        this.wasRejected[i] = 1;
        continue;
      }
      this.wasRejected[i] = 0;
      this.accepted[i] = 1;
      // Running variance estimate of the residual (per axis), floored at a quarter of the white noise.
      const v = this.variance[i]! + (0.5 * (rN * rN + rE * rE) - estVar - this.variance[i]!) / VARIANCE_TAU_S;
      const floor = 0.25 * f.whiteSd * f.whiteSd;
      this.variance[i] = v > floor ? v : floor;
      const w = 1 / this.variance[i]!;
      this.inv[i] = w;
      invSum += w;
      zN += w * mN;
      zE += w * mE;
      this.onlineS[i] = this.onlineS[i]! + 1;
      this.resN[i] = this.resN[i]! + rN;
      this.resE[i] = this.resE[i]! + rE;
      this.resN2[i] = this.resN2[i]! + rN * rN;
      this.resE2[i] = this.resE2[i]! + rE * rE;
      this.resCount[i] = this.resCount[i]! + 1;
    }
    for (let i = 0; i < this.n; i++) {
      const w = invSum > 0 ? this.inv[i]! / invSum : 0;
      this.weight[i] = w;
      this.weightSum[i] = this.weightSum[i]! + w;
    }
    if (invSum > 0) {
      this.fusedN = zN / invSum;
      this.fusedE = zE / invSum;
      this.fusedVar = 1 / invSum;
    } else {
      this.fusedVar = Number.NaN;
    }
  }

  /** The systems are not in use (DP off): no measurements, no weights. */
  idle(): void {
    this.accepted.fill(0);
    this.weight.fill(0);
    this.fusedVar = Number.NaN;
  }

  resetInterval(): void {
    this.onlineS.fill(0);
    this.weightSum.fill(0);
    this.resN.fill(0);
    this.resE.fill(0);
    this.resN2.fill(0);
    this.resE2.fill(0);
    this.resCount.fill(0);
    this.rejected.fill(0);
  }
}
