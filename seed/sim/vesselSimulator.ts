import type { FleetVessel } from '../../lib/register/fleetFile';
import type { PowerRecord, RefsRecord, StationRecord, ThrustersRecord, TrackRecord } from '../../lib/telemetry/schemas';
import { headingErrorStats, positionErrorStats, round } from '../intervalStatistics';
import { seedOf } from '../random';
import { SimRandom } from './fastNormal';
import type { DemoSite } from '../sites';
import { Allocator, thrustForce } from './allocation';
import { DEG, deg360, wrapPi } from './constants';
import { DpController } from './controller';
import { Environment, waveDriftForce, windForce } from './environment';
import { AxisFilter } from './estimator';
import { PowerPlant } from './power';
import { ReferenceSystems } from './references';
import { reduceBuses, reduceReferences, reduceThrusters, setPointOf, trackRecord, type BusSums, type ThrusterSums } from './intervalRecords';
import { ThrusterBank, thrusterLayout, type ThrusterSpec } from './thrusters';
import { stepVessel, vesselModel, type VesselModel, type VesselState } from './vesselModel';

/**
 * A physics-based simulator of one DP vessel at 1 Hz that reduces each
 * interval to the telemetry-v1 statistics (station, thrusters, power, refs)
 * and, optionally, the 1 Hz track stream.
 *
 * It exists to make realistic demo and test data for Holdfast. It is NOT a DP
 * system and must never be used to control anything.
 *
 * Loop per second (after Sørensen 2011, Fig. 2, and Fossen 2011 ch. 11–12):
 * environment → vessel dynamics → reference systems (noise, dropouts,
 * rejection, inverse-variance fusion) → Kalman filter with bias states →
 * PID + wind feed-forward → thrust allocation → power limit → thruster
 * dynamics. The statistics use the DP's estimated position and heading (what
 * the onboard gateway reads from the DP system); the optional track stream
 * carries the simulated true position.
 *
 * Choices where telemetry-v1 leaves room (invented, for demo data):
 * - mode is always auto_position and every thruster runs the whole interval
 *   (no starts/stops, no DP mode changes, no blackouts yet);
 * - refs `sd_m` is the per-axis standard deviation of the accepted residuals,
 *   √((var_N + var_E)/2); `weight` is the mean over all seconds of the
 *   interval (0 while offline or rejected);
 * - `current_ms`/`current_to_deg` report the simulated current (mean vector);
 * - `residual_kn` is the estimator's bias acceleration × body-axis masses.
 */

export interface SimRecords {
  station: StationRecord;
  thrusters: ThrustersRecord;
  power: PowerRecord;
  refs: RefsRecord;
  /** One record per second when the simulator was created with `track: true`. */
  track?: TrackRecord[];
}

export interface SimOptions {
  /** Extra seed mixed with the vessel key (default 0). */
  seed?: number;
  /** Produce the 1 Hz track stream. */
  track?: boolean;
  /** Steady mean wind, m/s (gusts still on), for tests; default: weather varying over days. */
  fixedWindMs?: number;
  /** No current, reference dropouts/glitches or generator trips (tests). */
  calm?: boolean;
  /** Seconds simulated before the first interval so the loop has settled (default 600). */
  warmUpS?: number;
}

/** Anemometer noise (from memory): 2 % of speed, 2° of direction. Wind feed-forward model error −10 % (invented). */
const ANEMO_SPEED_SD = 0.02;
const ANEMO_DIR_SD = 2 * DEG;
const FF_MODEL = 0.9;
/** Gyro compass white noise, rad (from memory). */
const GYRO_SD = 0.05 * DEG;
const MAX_OFF_BOW = 30 * DEG;
const MAX_TURN = 0.05 * DEG;
const SP_RESET_M = 30;

export class VesselSimulator {
  private readonly rng: SimRandom;
  private readonly mdl: VesselModel;
  private readonly specs: ThrusterSpec[];
  private readonly env: Environment;
  private readonly refs: ReferenceSystems;
  private readonly bank: ThrusterBank;
  private readonly alloc: Allocator;
  private readonly plant: PowerPlant;
  private readonly ctrl: DpController;
  private readonly kfN: AxisFilter;
  private readonly kfE: AxisFilter;
  private readonly kfPsi: AxisFilter;
  readonly state: VesselState;
  private spHdg: number;
  /** Shuttle tankers weathervane: the heading set point follows the low-passed wind direction. */
  private readonly weathervane: boolean;
  private vaneCos = 0;
  private vaneSin = 0;
  /** Position set point, m north/east of the site. */
  private spN = 0;
  private spE = 0;
  private readonly fw = new Float64Array(3);
  private readonly ff = new Float64Array(3);
  private readonly ft = new Float64Array(3);
  private readonly busNow: Float64Array;
  private readonly busPrevLimit: Uint8Array;
  private readonly prevAngle: Float64Array;
  private started = false;
  private nextS = 0;
  // Interval buffers (reused).
  private errN: number[] = [];
  private errE: number[] = [];
  private errH: number[] = [];
  private readonly u: ThrusterSums;
  private readonly b: BusSums;
  private readonly acc = { windSum: 0, windCos: 0, windSin: 0, gustMax: 0, w1: 0, w2: 0, curN: 0, curE: 0, resN: 0, resE: 0 };
  /** Last true position error from the set point (m) and heading error (rad), for tests. */
  trueErrN = 0;
  trueErrE = 0;
  trueErrHdg = 0;

  constructor(
    readonly vessel: FleetVessel,
    readonly site: DemoSite,
    private readonly opts: SimOptions = {},
  ) {
    this.rng = new SimRandom((seedOf(vessel.key) ^ (opts.seed ?? 0)) >>> 0);
    this.mdl = vesselModel(vessel);
    this.specs = thrusterLayout(vessel, this.mdl.p);
    this.spHdg = site.heading * DEG;
    this.weathervane = vessel.type.trim().toLowerCase() === 'shuttle tanker';
    this.vaneCos = Math.cos(this.spHdg);
    this.vaneSin = Math.sin(this.spHdg);
    const calm = opts.calm ?? false;
    // Prevailing weather 20° off the bow (the demo vessels head roughly into it).
    this.env = new Environment(this.rng, this.spHdg + 20 * DEG, opts.fixedWindMs, calm);
    this.refs = new ReferenceSystems(vessel, this.rng, !calm);
    this.bank = new ThrusterBank(this.specs);
    this.alloc = new Allocator(this.specs);
    this.plant = new PowerPlant(vessel, this.rng);
    this.ctrl = new DpController(this.mdl, [this.alloc.capacity(0), this.alloc.capacity(1), this.alloc.capacity(2)]);
    // Process noise (hand-tuned, common practice, no source).
    this.kfN = new AxisFilter(1e-4, 1e-9, 1);
    this.kfE = new AxisFilter(1e-4, 1e-9, 1);
    this.kfPsi = new AxisFilter(1e-8, 1e-14, 1e-4);
    this.kfPsi.p = this.spHdg;
    this.state = { north: 0, east: 0, psi: this.spHdg, u: 0, v: 0, r: 0 };
    const nT = this.specs.length;
    const f = () => new Float64Array(nT);
    this.u = { run: f(), rpm: f(), loadSum: f(), loadMax: f(), thrust: f(), power: f(), cos: f(), sin: f(), travel: f(), bands: new Float64Array(nT * 11) };
    const nB = this.plant.nBus;
    this.b = { kw: new Float64Array(nB), kwMax: new Float64Array(nB), avail: new Float64Array(nB), limitS: new Float64Array(nB), events: new Int32Array(nB) };
    this.busNow = new Float64Array(nB);
    this.busPrevLimit = new Uint8Array(nB);
    this.prevAngle = Float64Array.from(this.bank.angle);
  }

  /** The thruster layout in use (positions, rated thrust). */
  get layout(): readonly ThrusterSpec[] {
    return this.specs;
  }

  /** The records of [tMs, tMs + dt·1000). Call with consecutive intervals. */
  interval(tMs: number, dt: number): SimRecords {
    const t0 = Math.floor(tMs / 1000);
    if (!this.started) {
      this.started = true;
      const warm = this.opts.warmUpS ?? 600;
      for (let s = t0 - warm; s < t0; s++) this.step(s, -1);
      this.nextS = t0;
    }
    // Continue from where the last interval ended; a gap is simulated through.
    for (let s = this.nextS; s < t0; s++) this.step(s, -1);
    if (this.errN.length !== dt) {
      this.errN = new Array<number>(dt).fill(0);
      this.errE = new Array<number>(dt).fill(0);
      this.errH = new Array<number>(dt).fill(0);
    }
    this.resetInterval();
    const track: TrackRecord[] | undefined = this.opts.track ? [] : undefined;
    for (let i = 0; i < dt; i++) {
      this.step(t0 + i, i);
      if (track) track.push(trackRecord(this.site, (t0 + i) * 1000, this.state, this.spN, this.spE, this.spHdg));
    }
    this.nextS = t0 + dt;
    const records = this.reduce(tMs, dt);
    return track ? { ...records, track } : records;
  }

  /** One second of simulation; i ≥ 0 records statistics into slot i. */
  private step(tS: number, i: number): void {
    const st = this.state, mdl = this.mdl, rng = this.rng;
    const env = this.env.step(tS);
    // True loads on the vessel.
    windForce(mdl, st.psi, env.windSpeed, env.windFrom, this.fw);
    waveDriftForce(mdl, st.psi, env.hs, env.windFrom, env.driftFactor, this.fw);
    thrustForce(this.specs, this.bank.thrust, this.bank.angle, this.ft, this.bank.cos, this.bank.sin);
    stepVessel(st, mdl, this.fw[0]! + this.ft[0]!, this.fw[1]! + this.ft[1]!, this.fw[2]! + this.ft[2]!, env.curN, env.curE, 1);

    // Sensors: anemometer, gyro.
    const windM = env.windSpeed * (1 + ANEMO_SPEED_SD * rng.normal());
    const windFromM = env.windFrom + ANEMO_DIR_SD * rng.normal();
    const psiM = st.psi + GYRO_SD * rng.normal();

    // Estimator prediction with the known forces of the step just taken.
    const kfN = this.kfN, kfE = this.kfE, kfPsi = this.kfPsi;
    const psiHat = kfPsi.p;
    windForce(mdl, psiHat, windM, windFromM, this.ff, FF_MODEL);
    const c = Math.cos(psiHat), s = Math.sin(psiHat);
    const uHat = c * kfN.v + s * kfE.v, vHat = -s * kfN.v + c * kfE.v;
    const ax = (this.ft[0]! + this.ff[0]! - mdl.d11 * uHat) / mdl.m11;
    const ay = (this.ft[1]! + this.ff[1]! - mdl.d22 * vHat) / mdl.m22;
    const ar = (this.ft[2]! + this.ff[2]! - mdl.d33 * kfPsi.v) / mdl.m33;
    kfN.predict(c * ax - s * ay, 1);
    kfE.predict(s * ax + c * ay, 1);
    kfPsi.predict(ar, 1);
    kfPsi.update(psiM, GYRO_SD * GYRO_SD, wrapPi);
    kfPsi.p = wrapPi(kfPsi.p);

    const refs = this.refs;
    refs.step(tS, st.north, st.east, kfN.p, kfE.p, kfN.P00);
    if (refs.fusedVar === refs.fusedVar) {
      kfN.update(refs.fusedN, refs.fusedVar);
      kfE.update(refs.fusedE, refs.fusedVar);
    }

    // Heading set point toward the weather (Sørensen 2011 §4.4: weathervaning / minimum-power heading):
    // "the weather" is the direction the estimated environmental force (wind feed-forward plus the
    // estimator's bias force) comes from, low-passed over 10 min. Shuttle tankers follow it; other types
    // keep their heading while it is within ±30° of the bow and otherwise turn to keep it there, as an
    // operator would (common practice, no source). The set point turns at most 0.05°/s.
    {
      const bx = c * kfN.b + s * kfE.b, by = -s * kfN.b + c * kfE.b;
      const fx = this.ff[0]! + bx * mdl.m11, fy = this.ff[1]! + by * mdl.m22;
      const fN = c * fx - s * fy, fE = s * fx + c * fy;
      const mag = Math.sqrt(fN * fN + fE * fE);
      if (mag > 0) {
        this.vaneCos += (-fN / mag - this.vaneCos) / 600;
        this.vaneSin += (-fE / mag - this.vaneSin) / 600;
      }
    }
    const weather = Math.atan2(this.vaneSin, this.vaneCos);
    let want = weather;
    if (!this.weathervane) {
      const off = wrapPi(this.spHdg - weather);
      want = off > MAX_OFF_BOW ? weather + MAX_OFF_BOW : off < -MAX_OFF_BOW ? weather - MAX_OFF_BOW : this.spHdg;
    }
    let turn = wrapPi(want - this.spHdg);
    if (turn > MAX_TURN) turn = MAX_TURN;
    else if (turn < -MAX_TURN) turn = -MAX_TURN;
    this.spHdg = wrapPi(this.spHdg + turn);
    // An operator takes a new position set point when the vessel is far off (invented rule, 30 m): keeps
    // a rare drive-off in extreme weather from running away with the demo data.
    {
      const eN = kfN.p - this.spN, eE = kfE.p - this.spE;
      if (eN * eN + eE * eE > SP_RESET_M * SP_RESET_M) {
        this.spN = kfN.p;
        this.spE = kfE.p;
      }
    }

    // Control: PID on the estimate plus wind feed-forward (cancel the estimated wind force).
    const eYaw = wrapPi(kfPsi.p - this.spHdg);
    const spN = this.spN, spE = this.spE;
    const c2 = Math.cos(kfPsi.p), s2 = Math.sin(kfPsi.p);
    const tau = this.ctrl.step(kfN.p - spN, kfE.p - spE, eYaw, kfPsi.p, c2 * kfN.v + s2 * kfE.v, -s2 * kfN.v + c2 * kfE.v, kfPsi.v, -this.ff[0]!, -this.ff[1]!, -this.ff[2]!, 1);
    const bank = this.bank, plant = this.plant;
    this.alloc.allocate(tau[0]!, tau[1]!, tau[2]!, bank.angle);
    plant.stepGenerators(tS, !(this.opts.calm ?? false));
    plant.limit(this.specs, this.alloc.cmdThrust);
    bank.step(this.alloc.cmdThrust, this.alloc.cmdAngle, plant.scale);

    this.trueErrN = st.north - spN;
    this.trueErrE = st.east - spE;
    this.trueErrHdg = wrapPi(st.psi - this.spHdg);
    if (i < 0) {
      this.prevAngle.set(bank.angle);
      for (let b = 0; b < plant.nBus; b++) this.busPrevLimit[b] = plant.limitActive[b]!;
      return;
    }

    // Statistics of this second.
    this.errN[i] = kfN.p - spN;
    this.errE[i] = kfE.p - spE;
    this.errH[i] = eYaw / DEG;
    const u = this.u;
    this.busNow.set(plant.hotelW);
    for (let k = 0; k < this.specs.length; k++) {
      const sp = this.specs[k]!;
      const p = bank.power[k]!;
      const load = (100 * p) / sp.ratedW;
      u.run[k] = u.run[k]! + 1;
      u.rpm[k] = u.rpm[k]! + bank.speed[k]! * sp.maxRpm;
      u.loadSum[k] = u.loadSum[k]! + load;
      if (load > u.loadMax[k]!) u.loadMax[k] = load;
      const band = load >= 100 ? 10 : Math.floor(load / 10);
      u.bands[k * 11 + band] = u.bands[k * 11 + band]! + 1;
      u.thrust[k] = u.thrust[k]! + Math.abs(bank.thrust[k]!);
      u.power[k] = u.power[k]! + p;
      if (sp.azimuthing) {
        const a = bank.angle[k]!;
        u.cos[k] = u.cos[k]! + bank.cos[k]!;
        u.sin[k] = u.sin[k]! + bank.sin[k]!;
        u.travel[k] = u.travel[k]! + Math.abs(a - this.prevAngle[k]!);
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
    a.windSum += windM;
    a.windCos += Math.cos(windFromM);
    a.windSin += Math.sin(windFromM);
    // 3 s gust: the largest 3-sample running mean.
    if (i >= 2) {
      const g = (a.w2 + a.w1 + windM) / 3;
      if (g > a.gustMax) a.gustMax = g;
    }
    a.w2 = a.w1;
    a.w1 = windM;
    a.curN += env.curN;
    a.curE += env.curE;
    // Residual force: the estimator's bias acceleration times the body-axis masses, back in the earth frame.
    const bx = c2 * kfN.b + s2 * kfE.b, by = -s2 * kfN.b + c2 * kfE.b;
    const fx = bx * mdl.m11, fy = by * mdl.m22;
    a.resN += c2 * fx - s2 * fy;
    a.resE += s2 * fx + c2 * fy;
  }

  private resetInterval(): void {
    const u = this.u;
    for (const arr of Object.values(u)) arr.fill(0);
    const b = this.b;
    for (const arr of Object.values(b)) arr.fill(0);
    this.refs.resetInterval();
    const a = this.acc;
    a.windSum = a.windCos = a.windSin = a.gustMax = a.w1 = a.w2 = a.curN = a.curE = a.resN = a.resE = 0;
  }

  private reduce(tMs: number, dt: number): SimRecords {
    const t = new Date(tMs).toISOString();
    const a = this.acc;
    const wind = a.windSum / dt;
    const curN = a.curN / dt, curE = a.curE / dt;
    const resN = a.resN / dt, resE = a.resE / dt;
    const env: NonNullable<StationRecord['env']> = {
      wind_ms: round(wind, 2),
      wind_gust_ms: round(Math.max(a.gustMax, wind), 2),
      wind_from_deg: round(deg360(Math.atan2(a.windSin, a.windCos)), 1) % 360,
      current_ms: round(Math.hypot(curN, curE), 2),
      current_to_deg: round(deg360(Math.atan2(curE, curN)), 1) % 360,
      residual_kn: round(Math.hypot(resN, resE) / 1000, 1),
      residual_to_deg: round(deg360(Math.atan2(resE, resN)), 1) % 360,
    };
    const station: StationRecord = {
      v: 1,
      t,
      dt,
      mode: 'auto_position',
      dp_s: dt,
      n: dt,
      sp: setPointOf(this.site, this.spN, this.spE, this.spHdg),
      err: positionErrorStats(this.errN, this.errE),
      hdg_err: headingErrorStats(this.errH),
      env,
    };
    const units = reduceThrusters(this.specs, this.u);
    const buses = reduceBuses(this.vessel.buses.length ? this.vessel.buses.map((x) => x.id) : ['MAIN'], this.b, this.plant.gens, dt);
    const systems = reduceReferences(this.refs, dt);
    return {
      station,
      thrusters: { v: 1, t, dt, units },
      power: { v: 1, t, dt, buses },
      refs: { v: 1, t, dt, systems },
    };
  }
}
