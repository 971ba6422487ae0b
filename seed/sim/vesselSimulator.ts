import type { FleetVessel } from '../../lib/register/fleetFile';
import type { TrackRecord } from '../../lib/telemetry/schemas';
import type { SimKnobs, SimOptions, SimRecords, SimTexts } from './simTypes';
import { seedOf } from '../random';
import { SimRandom } from './fastNormal';
import type { DemoSite } from '../sites';
import { Allocator, thrustForce } from './allocation';
import { DEG, wrapPi } from './constants';
import { DpController } from './controller';
import { environmentForce, Environment, windForce } from './environment';
import { AxisFilter } from './estimator';
import { IntervalAccumulator } from './intervalAccumulator';
import { trackRecord } from './intervalRecords';
import { AUTO_POSITION, AUTO_TRACK, JOYSTICK, ModeSchedule, patternFor, STANDBY } from './modes';
import { PowerPlant } from './power';
import { ReferenceSystems } from './references';
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
 * DP modes follow an invented pattern per vessel type (modes.ts): in
 * auto_track the set point moves; in joystick an operator holds the vessel
 * with softer gains and no integral build-up to speak of; in standby the
 * vessel is away on passage (no vessel physics: only its main propellers at
 * transit load, every other unit stopped), and returns to the site through a
 * joystick approach with every unit started. The choices of the per-interval
 * records are listed in intervalAccumulator.ts.
 *
 * Scenarios change the vessel through `faults` (knobs applied at the start of
 * every interval): thruster fouling, reference noise, generator derating,
 * controller gains, and the weather.
 */

export type { Faults, SimKnobs, SimOptions, SimRecords, SimTexts } from './simTypes';

/** Anemometer noise (from memory): 2 % of speed, 2° of direction. Wind feed-forward model error −10 % (invented). */
const ANEMO_SPEED_SD = 0.02;
const ANEMO_DIR_SD = 2 * DEG;
const FF_MODEL = 0.9;
/** Gyro compass white noise, rad (from memory). */
const GYRO_SD = 0.05 * DEG;
const MAX_OFF_BOW = 30 * DEG;
const MAX_TURN = 0.05 * DEG;
const SP_RESET_M = 30;
/** An operator on the joystick holds position less tightly than the controller: a third of its gains (invented). */
const JOYSTICK_GAIN = 0.35;
/** Thruster bias where the azimuths allow it, fraction of rating (common practice, no source). */
const THRUSTER_BIAS = 0.2;
/** On passage the engineer keeps a section's load under this share of its online power (invented). */
const PASSAGE_MAX_SHARE = 0.8;
/** Distance from the set point at which a returning vessel hands over to the joystick, m (invented). */
const ARRIVAL_M = [8, 20] as const;

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
  private readonly schedule?: ModeSchedule;
  private readonly acc: IntervalAccumulator;
  private readonly knobs: SimKnobs;
  readonly state: VesselState;
  private mode = AUTO_POSITION;
  private spHdg: number;
  /** Shuttle tankers weathervane: the heading set point follows the low-passed wind direction. */
  private readonly weathervane: boolean;
  private vaneCos = 0;
  private vaneSin = 0;
  /** Position set point, m north/east of the site, and its speed along the heading in auto_track (m/s). */
  private spN = 0;
  private spE = 0;
  private trackSpeed = 0;
  /** Units that drive the vessel on passage (main propellers; else the azimuths), and their command. */
  private readonly transitUnit: Uint8Array;
  private readonly transitCmd: Float64Array;
  private readonly transitOnBus: Float64Array;
  private readonly fw = new Float64Array(3);
  private readonly ff = new Float64Array(3);
  private readonly ft = new Float64Array(3);
  private started = false;
  private nextS = 0;
  /** Last true position error from the set point (m) and heading error (rad), for tests. */
  trueErrN = 0;
  trueErrE = 0;
  trueErrHdg = 0;

  constructor(
    readonly vessel: FleetVessel,
    readonly site: DemoSite,
    private readonly opts: SimOptions = {},
  ) {
    const seed = (seedOf(vessel.key) ^ (opts.seed ?? 0)) >>> 0;
    this.rng = new SimRandom(seed);
    this.mdl = vesselModel(vessel);
    this.specs = thrusterLayout(vessel, this.mdl.p);
    this.spHdg = site.heading * DEG;
    this.weathervane = vessel.type.trim().toLowerCase() === 'shuttle tanker';
    this.vaneCos = Math.cos(this.spHdg);
    this.vaneSin = Math.sin(this.spHdg);
    const calm = opts.calm ?? false;
    // Prevailing weather 20° off the bow (the demo vessels head roughly into it). The weather draws from
    // a generator of its own, so that a fault changes nothing in the weather the vessel meets.
    this.env = new Environment(new SimRandom((seed ^ 0x9e3779b9) >>> 0), this.spHdg + 20 * DEG, opts.fixedWindMs, calm);
    if (opts.steadyCurrent) {
      const to = opts.steadyCurrent.toDeg * DEG;
      this.env.steadyCurrent = { north: opts.steadyCurrent.ms * Math.cos(to), east: opts.steadyCurrent.ms * Math.sin(to) };
    }
    this.refs = new ReferenceSystems(vessel, this.rng, !calm);
    this.bank = new ThrusterBank(this.specs);
    this.alloc = new Allocator(this.specs);
    this.alloc.bias = THRUSTER_BIAS;
    this.plant = new PowerPlant(vessel, this.rng);
    this.ctrl = new DpController(this.mdl, [this.alloc.capacity(0), this.alloc.capacity(1), this.alloc.capacity(2)]);
    // Process noise (hand-tuned, common practice, no source).
    this.kfN = new AxisFilter(1e-4, 1e-9, 1);
    this.kfE = new AxisFilter(1e-4, 1e-9, 1);
    this.kfPsi = new AxisFilter(1e-8, 1e-14, 1e-4);
    this.kfPsi.p = this.spHdg;
    this.state = { north: 0, east: 0, psi: this.spHdg, u: 0, v: 0, r: 0 };
    // The mode pattern has a seed of its own: scenarios never move a vessel's port calls.
    if (opts.modes ?? true) this.schedule = new ModeSchedule(patternFor(vessel.type), (seed ^ 0x5eed) >>> 0);
    const hasMain = this.specs.some((s) => s.kind === 'main');
    this.transitUnit = Uint8Array.from(this.specs.map((s) => (hasMain ? s.kind === 'main' : s.azimuthing) ? 1 : 0));
    this.transitCmd = new Float64Array(this.specs.length);
    this.transitOnBus = new Float64Array(this.plant.nBus);
    this.specs.forEach((sp, k) => {
      if (this.transitUnit[k]) this.transitOnBus[sp.bus] = this.transitOnBus[sp.bus]! + 1;
    });
    const busIds = vessel.buses.length ? vessel.buses.map((x) => x.id) : ['MAIN'];
    this.acc = new IntervalAccumulator(this.specs, busIds, this.bank, this.plant, this.refs);
    this.knobs = {
      thrusterPower: this.bank.powerFactor,
      refNoise: this.refs.noiseScale,
      genCapacity: this.plant.genCapacity,
      controllerGain: 1,
      windScale: 1,
    };
  }

  /** The thruster layout in use (positions, rated thrust). */
  get layout(): readonly ThrusterSpec[] {
    return this.specs;
  }

  /** The records of [tMs, tMs + dt·1000). Call with consecutive intervals. */
  interval(tMs: number, dt: number): SimRecords {
    const t0 = Math.floor(tMs / 1000);
    if (this.opts.faults) {
      this.opts.faults(tMs, this.knobs);
      this.env.windScale = this.knobs.windScale;
    }
    if (!this.started) {
      this.started = true;
      const warm = this.opts.warmUpS ?? 600;
      for (let s = t0 - warm; s < t0; s++) this.step(s, false);
      this.nextS = t0;
    }
    // Continue from where the last interval ended; a gap is simulated through.
    for (let s = this.nextS; s < t0; s++) this.step(s, false);
    this.acc.reset(dt);
    const track: TrackRecord[] | undefined = this.opts.track ? [] : undefined;
    for (let i = 0; i < dt; i++) {
      this.step(t0 + i, true);
      if (track && this.mode !== STANDBY) track.push(trackRecord(this.site, (t0 + i) * 1000, this.state, this.spN, this.spE, this.spHdg));
    }
    this.nextS = t0 + dt;
    const records = this.acc.reduce(tMs, dt, this.site, this.spN, this.spE, this.spHdg);
    return track ? { ...records, track } : records;
  }

  /** The same as `interval`, the four statistics records as JSON text (what a publisher sends). */
  intervalText(tMs: number, dt: number): SimTexts {
    const r = this.interval(tMs, dt);
    const texts: SimTexts = { station: JSON.stringify(r.station), thrusters: JSON.stringify(r.thrusters), power: JSON.stringify(r.power), refs: JSON.stringify(r.refs) };
    if (r.track) texts.track = r.track;
    return texts;
  }

  /** One second of simulation; `record` adds it to the interval's statistics. */
  private step(tS: number, record: boolean): void {
    const mode = this.schedule ? this.schedule.modeAt(tS) : AUTO_POSITION;
    if (mode !== this.mode) this.enterMode(mode, tS);
    const st = this.state, mdl = this.mdl, rng = this.rng;
    const env = this.env.step(tS);
    // Sensors: anemometer (always), gyro.
    const windM = env.windSpeed * (1 + ANEMO_SPEED_SD * rng.normal());
    const windFromM = env.windFrom + ANEMO_DIR_SD * rng.normal();
    if (mode === STANDBY) {
      this.passage(tS);
      if (record) this.acc.second(mode, windM, windFromM);
      else this.acc.skip();
      return;
    }

    // True loads on the vessel.
    environmentForce(mdl, st.psi, env, this.fw);
    thrustForce(this.specs, this.bank.thrust, this.bank.angle, this.ft, this.bank.cos, this.bank.sin);
    stepVessel(st, mdl, this.fw[0]! + this.ft[0]!, this.fw[1]! + this.ft[1]!, this.fw[2]! + this.ft[2]!, env.curN, env.curE, 1);
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

    this.steerHeading(c, s);
    // auto_track: the set point moves along the heading set point.
    const vspN = this.trackSpeed * Math.cos(this.spHdg), vspE = this.trackSpeed * Math.sin(this.spHdg);
    this.spN += vspN;
    this.spE += vspE;
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
    // cos and sin of the updated heading estimate from those of the predicted one (the gyro update moves
    // it by ~10⁻⁴ rad: first order is exact to ~10⁻⁸).
    const dPsi = wrapPi(kfPsi.p - psiHat);
    const c2 = c - s * dPsi, s2 = s + c * dPsi;
    const gain = this.knobs.controllerGain;
    this.ctrl.setGainScale(mode === JOYSTICK ? gain * JOYSTICK_GAIN : gain, gain);
    const rvN = kfN.v - vspN, rvE = kfE.v - vspE;
    const tau = this.ctrl.step(kfN.p - spN, kfE.p - spE, eYaw, kfPsi.p, c2 * rvN + s2 * rvE, -s2 * rvN + c2 * rvE, kfPsi.v, -this.ff[0]!, -this.ff[1]!, -this.ff[2]!, 1);
    const bank = this.bank, plant = this.plant;
    this.alloc.allocate(tau[0]!, tau[1]!, tau[2]!, bank.angle);
    plant.stepGenerators(tS, !(this.opts.calm ?? false));
    plant.limit(this.specs, this.alloc.cmdThrust, bank.on);
    bank.step(this.alloc.cmdThrust, this.alloc.cmdAngle, plant.scale);

    this.trueErrN = st.north - spN;
    this.trueErrE = st.east - spE;
    this.trueErrHdg = wrapPi(st.psi - this.spHdg);
    if (!record) {
      this.acc.skip();
      return;
    }
    this.acc.second(mode, windM, windFromM);
    // Residual force: the estimator's bias acceleration times the body-axis masses, back in the earth frame.
    const bx = c2 * kfN.b + s2 * kfE.b, by = -s2 * kfN.b + c2 * kfE.b;
    const fx = bx * mdl.m11, fy = by * mdl.m22;
    this.acc.position(kfN.p - spN, kfE.p - spE, eYaw / DEG, env.curN, env.curE, c2 * fx - s2 * fy, s2 * fx + c2 * fy);
  }

  /**
   * Heading set point toward the weather (Sørensen 2011 §4.4: weathervaning / minimum-power heading):
   * "the weather" is the direction the estimated environmental force (wind feed-forward plus the
   * estimator's bias force) comes from, low-passed over 10 min. Shuttle tankers follow it; other types
   * keep their heading while it is within ±30° of the bow and otherwise turn to keep it there, as an
   * operator would (common practice, no source). The set point turns at most 0.05°/s.
   */
  private steerHeading(c: number, s: number): void {
    const mdl = this.mdl, kfN = this.kfN, kfE = this.kfE;
    const bx = c * kfN.b + s * kfE.b, by = -s * kfN.b + c * kfE.b;
    const fx = this.ff[0]! + bx * mdl.m11, fy = this.ff[1]! + by * mdl.m22;
    const fN = c * fx - s * fy, fE = s * fx + c * fy;
    const mag = Math.sqrt(fN * fN + fE * fE);
    if (mag > 0) {
      this.vaneCos += (-fN / mag - this.vaneCos) / 600;
      this.vaneSin += (-fE / mag - this.vaneSin) / 600;
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
  }

  /**
   * A second on passage: generators, power limit and the transit units at the
   * segment's load (fraction of rated), kept under PASSAGE_MAX_SHARE of their
   * section's rating (power management connects what that needs).
   */
  private passage(tS: number): void {
    const level = this.schedule!.current.param;
    const plant = this.plant;
    plant.stepGenerators(tS, !(this.opts.calm ?? false));
    for (let k = 0; k < this.specs.length; k++) {
      const sp = this.specs[k]!;
      if (!this.transitUnit[k]) continue;
      const cap = (PASSAGE_MAX_SHARE * plant.ratedW[sp.bus]! - plant.hotelW[sp.bus]!) / (this.transitOnBus[sp.bus]! * sp.ratedW);
      // Thrust fraction whose power is that share of rated (P = idle + (1 − idle) f^(3/2)), ±2 % of load.
      const load = (level < cap ? level : cap) * (1 + 0.02 * this.rng.normal());
      const f = load > sp.idle ? ((load - sp.idle) / (1 - sp.idle)) ** (2 / 3) : 0;
      this.transitCmd[k] = f * sp.maxThrust;
    }
    this.plant.limit(this.specs, this.transitCmd, this.bank.on);
    this.bank.step(this.transitCmd, this.bank.angle, this.plant.scale);
  }

  private enterMode(mode: number, tS: number): void {
    const was = this.mode;
    this.mode = mode;
    if (mode === STANDBY) {
      this.plant.connectAll(tS);
      for (let k = 0; k < this.specs.length; k++) this.bank.setRunning(k, this.transitUnit[k] === 1);
      this.transitCmd.fill(0);
      this.refs.idle();
      return;
    }
    if (was === STANDBY) this.arrive(tS);
    this.trackSpeed = mode === AUTO_TRACK ? this.schedule!.current.param : 0;
  }

  /** Back from passage: at the site's set point, a few metres off, every unit started. */
  private arrive(tS: number): void {
    const st = this.state, rng = this.rng;
    this.spN = 0;
    this.spE = 0;
    const r = ARRIVAL_M[0] + (ARRIVAL_M[1] - ARRIVAL_M[0]) * rng.next(), a = 2 * Math.PI * rng.next();
    st.north = r * Math.cos(a);
    st.east = r * Math.sin(a);
    st.u = st.v = st.r = 0;
    st.psi = this.spHdg;
    for (const [kf, p] of [[this.kfN, st.north], [this.kfE, st.east], [this.kfPsi, st.psi]] as const) {
      kf.p = p;
      kf.v = kf.b = 0;
      kf.P01 = kf.P02 = kf.P12 = 0;
      kf.P00 = kf === this.kfPsi ? 1e-4 : 1;
      kf.P11 = 0.01;
      kf.P22 = 1e-6;
    }
    this.ctrl.reset();
    this.plant.connectAll(tS);
    for (let k = 0; k < this.specs.length; k++) this.bank.setRunning(k, true);
  }
}
