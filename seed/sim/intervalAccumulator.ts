import type { StationRecord } from '../../lib/telemetry/schemas';
import type { DemoSite } from '../sites';
import { headingErrorStats, positionErrorStats, round } from '../intervalStatistics';
import { deg360 } from './constants';
import { reduceBuses, reduceReferences, reduceThrusters, setPointOf, type BusSums, type ThrusterSums } from './intervalRecords';
import { AUTO_POSITION, MODE_NAMES, type DpMode } from './modes';
import type { PowerPlant } from './power';
import type { ReferenceSystems } from './references';
import type { ThrusterBank, ThrusterSpec } from './thrusters';
import type { SimRecords } from './simTypes';

/**
 * The sums one interval's records are made of, kept in typed arrays by the
 * 1 Hz loop (no allocation per second), and their reduction to telemetry-v1
 * records at the end of the interval.
 *
 * Choices where telemetry-v1 leaves room (invented, for demo data):
 * - `mode` is the mode held longest (ties: the first of MODE_NAMES); `dp_s`
 *   counts auto_position seconds; `n` counts the seconds with a set point
 *   (every mode but standby), and the error statistics cover those;
 * - in an interval entirely in standby the record has no `sp`, `err`,
 *   `hdg_err`, nor estimated current or residual force (the DP is off);
 * - refs `sd_m` is the per-axis standard deviation of the accepted residuals,
 *   √((var_N + var_E)/2); `weight` is the mean over all seconds of the
 *   interval (0 while offline, rejected or in standby);
 * - `current_ms`/`current_to_deg` report the simulated current (mean vector);
 * - `residual_kn` is the estimator's bias acceleration × body-axis masses.
 */
export class IntervalAccumulator {
  private errN: Float64Array;
  private errE: Float64Array;
  private errH: Float64Array;
  private n = 0;
  private readonly modeS = new Int32Array(MODE_NAMES.length);
  private readonly u: ThrusterSums;
  private readonly b: BusSums;
  private readonly busNow: Float64Array;
  private readonly busPrevLimit: Uint8Array;
  private readonly prevAngle: Float64Array;
  private readonly acc = { windSum: 0, windCos: 0, windSin: 0, gustMax: 0, w1: 0, w2: 0, seconds: 0, dpS: 0, curN: 0, curE: 0, resN: 0, resE: 0 };

  constructor(
    private readonly specs: readonly ThrusterSpec[],
    private readonly busIds: readonly string[],
    private readonly bank: ThrusterBank,
    private readonly plant: PowerPlant,
    private readonly refs: ReferenceSystems,
  ) {
    const nT = specs.length;
    const f = () => new Float64Array(nT);
    this.u = { run: f(), rpm: f(), pitch: f(), loadMax: f(), thrust: f(), power: f(), cos: f(), sin: f(), travel: f(), bands: new Float64Array(nT * 11) };
    const nB = plant.nBus;
    this.b = { kw: new Float64Array(nB), kwMax: new Float64Array(nB), avail: new Float64Array(nB), limitS: new Float64Array(nB), events: new Int32Array(nB) };
    this.busNow = new Float64Array(nB);
    this.busPrevLimit = new Uint8Array(nB);
    this.prevAngle = Float64Array.from(bank.angle);
    this.errN = new Float64Array(0);
    this.errE = new Float64Array(0);
    this.errH = new Float64Array(0);
  }

  /** Start an interval of dt seconds. */
  reset(dt: number): void {
    if (this.errN.length < dt) {
      this.errN = new Float64Array(dt);
      this.errE = new Float64Array(dt);
      this.errH = new Float64Array(dt);
    }
    this.n = 0;
    this.modeS.fill(0);
    for (const arr of Object.values(this.u)) arr.fill(0);
    for (const arr of Object.values(this.b)) arr.fill(0);
    this.bank.starts.fill(0);
    this.refs.resetInterval();
    const a = this.acc;
    a.windSum = a.windCos = a.windSin = a.gustMax = a.w1 = a.w2 = a.seconds = a.dpS = a.curN = a.curE = a.resN = a.resE = 0;
  }

  /** A second outside any interval (warm-up, gaps): only what carries over is kept. */
  skip(): void {
    this.prevAngle.set(this.bank.angle);
    this.busPrevLimit.set(this.plant.limitActive);
  }

  /** Mode, thrusters, buses and wind of one recorded second. */
  second(mode: number, windM: number, windFromM: number): void {
    this.modeS[mode] = this.modeS[mode]! + 1;
    const bank = this.bank, plant = this.plant, u = this.u;
    this.busNow.set(plant.hotelW);
    for (let k = 0; k < this.specs.length; k++) {
      if (!bank.on[k]) continue;
      const sp = this.specs[k]!;
      const p = bank.power[k]!;
      const load = (100 * p) / sp.ratedW;
      const s = bank.speed[k]!;
      u.run[k] = u.run[k]! + 1;
      // Controllable pitch: constant speed, the pitch varies; fixed pitch: the speed varies. (Mean load comes from Σ power.)
      if (sp.cpp) u.pitch[k] = u.pitch[k]! + 100 * s;
      else u.rpm[k] = u.rpm[k]! + s * sp.maxRpm;
      if (load > u.loadMax[k]!) u.loadMax[k] = load;
      const band = load >= 100 ? 10 : (load / 10) | 0;
      u.bands[k * 11 + band] = u.bands[k * 11 + band]! + 1;
      u.thrust[k] = u.thrust[k]! + Math.abs(bank.thrust[k]!);
      u.power[k] = u.power[k]! + p;
      if (sp.azimuthing) {
        const a = bank.angle[k]!;
        u.cos[k] = u.cos[k]! + bank.cos[k]!;
        u.sin[k] = u.sin[k]! + bank.sin[k]!;
        const d = a - this.prevAngle[k]!;
        u.travel[k] = u.travel[k]! + (d >= 0 ? d : -d);
        this.prevAngle[k] = a;
      }
      this.busNow[sp.bus] = this.busNow[sp.bus]! + p;
    }
    const b = this.b;
    for (let k = 0; k < plant.nBus; k++) {
      const kw = this.busNow[k]! / 1000;
      b.kw[k] = b.kw[k]! + kw;
      if (kw > b.kwMax[k]!) b.kwMax[k] = kw;
      b.avail[k] = b.avail[k]! + plant.availableW[k]! / 1000;
      const on = plant.limitActive[k]!;
      if (on) {
        b.limitS[k] = b.limitS[k]! + 1;
        if (!this.busPrevLimit[k]) b.events[k] = b.events[k]! + 1;
      }
      this.busPrevLimit[k] = on;
    }
    const a = this.acc;
    a.seconds++;
    if (mode === AUTO_POSITION) a.dpS++;
    a.windSum += windM;
    a.windCos += Math.cos(windFromM);
    a.windSin += Math.sin(windFromM);
    // 3 s gust: the largest 3-sample running mean.
    if (a.seconds >= 3) {
      const g = (a.w2 + a.w1 + windM) / 3;
      if (g > a.gustMax) a.gustMax = g;
    }
    a.w2 = a.w1;
    a.w1 = windM;
  }

  /**
   * Position (m) and heading (deg) error from the set point of a second with
   * the DP estimator running, with the current (m/s, earth) and the
   * estimator's residual force (N, earth).
   */
  position(errN: number, errE: number, errHdgDeg: number, curN: number, curE: number, resN: number, resE: number): void {
    const i = this.n++;
    this.errN[i] = errN;
    this.errE[i] = errE;
    this.errH[i] = errHdgDeg;
    const a = this.acc;
    a.curN += curN;
    a.curE += curE;
    a.resN += resN;
    a.resE += resE;
  }

  reduce(tMs: number, dt: number, site: DemoSite, spN: number, spE: number, spHdg: number): SimRecords {
    const t = new Date(tMs).toISOString();
    const a = this.acc, n = this.n;
    const wind = a.windSum / dt;
    const env: NonNullable<StationRecord['env']> = {
      wind_ms: round(wind, 2),
      wind_gust_ms: round(Math.max(a.gustMax, wind), 2),
      wind_from_deg: round(deg360(Math.atan2(a.windSin, a.windCos)), 1) % 360,
    };
    let mode = 0;
    for (let m = 1; m < MODE_NAMES.length; m++) if (this.modeS[m]! > this.modeS[mode]!) mode = m;
    const station: StationRecord = { v: 1, t, dt, mode: MODE_NAMES[mode] as DpMode, dp_s: a.dpS, n };
    if (n > 0) {
      const curN = a.curN / n, curE = a.curE / n, resN = a.resN / n, resE = a.resE / n;
      env.current_ms = round(Math.sqrt(curN * curN + curE * curE), 2);
      env.current_to_deg = round(deg360(Math.atan2(curE, curN)), 1) % 360;
      env.residual_kn = round(Math.sqrt(resN * resN + resE * resE) / 1000, 1);
      env.residual_to_deg = round(deg360(Math.atan2(resE, resN)), 1) % 360;
      station.sp = setPointOf(site, spN, spE, spHdg);
      station.err = positionErrorStats(this.errN.subarray(0, n), this.errE.subarray(0, n));
      station.hdg_err = headingErrorStats(this.errH.subarray(0, n));
    }
    station.env = env;
    return {
      station,
      thrusters: { v: 1, t, dt, units: reduceThrusters(this.specs, this.u, this.bank.starts) },
      power: { v: 1, t, dt, buses: reduceBuses(this.busIds, this.b, this.plant.gens, dt) },
      refs: { v: 1, t, dt, systems: reduceReferences(this.refs, dt) },
    };
  }
}
