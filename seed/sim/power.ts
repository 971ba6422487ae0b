import type { FleetVessel } from '../../lib/register/fleetFile';
import { Random } from '../random';
import type { ThrusterSpec } from './thrusters';

/**
 * Switchboard sections for the demo simulator (demo data only). Each section
 * has two generators of half its rated power (invented arrangement); hotel
 * load (invented per vessel type) is spread over the sections.
 *
 * Power management (load-dependent start and stop, common practice, no
 * source; thresholds invented): a section runs its lead generator alone while
 * the load allows; the second is started when the load stays above START_AT of
 * the online rating for START_AFTER_S, or when the power limit has been active
 * for OVERLOAD_AFTER_S, and connects START_DELAY_S later; it is stopped when
 * the load has stayed under STOP_AT of what would remain online for
 * STOP_AFTER_S. While two run, one trips now and then (mean time between trips
 * MTBT_S per section, back after 5–30 min; invented rates).
 *
 * Before a passage or a DP approach the engineer connects every generator
 * (`connectAll`).
 *
 * The power limit (a "fast load reduction", Sørensen 2011 §4.6) scales the
 * commanded thrust of a section's units so their power, P ∝ T^(3/2) (from
 * T ∝ n², P ∝ n³), fits what its generators can actually deliver, less a
 * reserve; once active it lets go when the demand falls under RELEASE of the
 * room and it has held HOLD_S. A derated generator (scenarios: `genCapacity` < 1) delivers less
 * than its rating while power management still counts its rating, so the
 * limit cuts in more and more often as the derating deepens.
 */

export const GENS_PER_BUS = 2;
const HOTEL_KW: Record<string, number> = { drilling: 2500, construction: 700, supply: 300, 'shuttle tanker': 600 }; // invented
const RESERVE = 0.95; // use at most 95 % of what is online (common practice, no source)
const RELEASE = 0.9; // the limit lets go when demand falls under 90 % of the room (hysteresis, invented)
const HOLD_S = 15; // … and has been active at least this long (invented)
const START_AT = 0.85;
const START_AFTER_S = 10;
const OVERLOAD_AFTER_S = 20;
const START_DELAY_S = 45;
const STOP_AT = 0.5;
const STOP_AFTER_S = 600;
const MTBT_S = 4 * 86_400; // per section while two generators run, invented

export class PowerPlant {
  readonly nBus: number;
  readonly ratedW: Float64Array;
  /** Generators connected, per bus. */
  readonly gens: Int32Array;
  /** Per generator (bus b, unit g at b·GENS_PER_BUS + g; g = 0 leads): 1 while connected. */
  readonly genOn: Uint8Array;
  /** Per generator: fraction of its rating it can deliver (1 = healthy). */
  readonly genCapacity: Float64Array;
  /** What the connected generators can deliver, per bus, W. */
  readonly availableW: Float64Array;
  readonly hotelW: Float64Array;
  /** Thrust scale per bus for the next step (1 = no limit). */
  readonly scale: Float64Array;
  readonly limitActive: Uint8Array;
  private readonly tripUntil: Float64Array;
  private readonly startIn: Int32Array;
  private readonly highS: Int32Array;
  private readonly lowS: Int32Array;
  private readonly limitRun: Int32Array;
  /** Predicted consumption of the last step, per bus, W. */
  private readonly loadW: Float64Array;
  private readonly demand: Float64Array;
  private readonly fixed: Float64Array;

  constructor(vessel: FleetVessel, private readonly rng: Random) {
    this.nBus = Math.max(1, vessel.buses.length);
    this.ratedW = Float64Array.from(vessel.buses.length ? vessel.buses.map((b) => b.rated_kw * 1000) : [1e7]);
    this.gens = new Int32Array(this.nBus).fill(GENS_PER_BUS);
    this.genOn = new Uint8Array(this.nBus * GENS_PER_BUS).fill(1);
    this.genCapacity = new Float64Array(this.nBus * GENS_PER_BUS).fill(1);
    this.tripUntil = new Float64Array(this.nBus * GENS_PER_BUS);
    this.availableW = Float64Array.from(this.ratedW);
    const hotelKw = HOTEL_KW[vessel.type.trim().toLowerCase()] ?? 500;
    this.hotelW = new Float64Array(this.nBus).fill((hotelKw * 1000) / this.nBus);
    this.scale = new Float64Array(this.nBus).fill(1);
    this.limitActive = new Uint8Array(this.nBus);
    this.startIn = new Int32Array(this.nBus);
    this.highS = new Int32Array(this.nBus);
    this.lowS = new Int32Array(this.nBus);
    this.limitRun = new Int32Array(this.nBus);
    this.loadW = new Float64Array(this.nBus);
    this.demand = new Float64Array(this.nBus);
    this.fixed = new Float64Array(this.nBus);
  }

  /** Power management at time tS (s): starts, stops, trips; updates the available power. */
  stepGenerators(tS: number, tripsEnabled = true): void {
    for (let b = 0; b < this.nBus; b++) {
      const g0 = b * GENS_PER_BUS;
      const perGen = this.ratedW[b]! / GENS_PER_BUS;
      let online = this.gens[b]!;
      if (this.startIn[b]! > 0 && --this.startIn[b]! === 0) {
        const g = this.firstOffline(g0, tS);
        if (g >= 0) {
          this.genOn[g] = 1;
          online++;
        }
      }
      // Load-dependent start (or overload start) of the next generator.
      this.highS[b] = this.loadW[b]! > START_AT * online * perGen ? this.highS[b]! + 1 : 0;
      if ((this.highS[b]! >= START_AFTER_S || this.limitRun[b]! >= OVERLOAD_AFTER_S) && this.startIn[b] === 0 && this.firstOffline(g0, tS) >= 0) {
        this.startIn[b] = START_DELAY_S;
      }
      // Load-dependent stop of the last one started, the lead generator stays.
      this.lowS[b] = online >= 2 && this.loadW[b]! < STOP_AT * (online - 1) * perGen ? this.lowS[b]! + 1 : 0;
      if (this.lowS[b]! >= STOP_AFTER_S) {
        for (let g = g0 + GENS_PER_BUS - 1; g > g0; g--) {
          if (this.genOn[g]) {
            this.genOn[g] = 0;
            online--;
            break;
          }
        }
        this.lowS[b] = 0;
      }
      if (tripsEnabled && online >= 2 && this.rng.next() < 1 / MTBT_S) {
        const g = g0 + Math.floor(this.rng.next() * GENS_PER_BUS);
        if (this.genOn[g]) {
          this.genOn[g] = 0;
          online--;
          this.tripUntil[g] = tS + 300 + this.rng.next() * 1500;
        }
      }
      let cap = 0;
      for (let g = g0; g < g0 + GENS_PER_BUS; g++) if (this.genOn[g]) cap += this.genCapacity[g]!;
      this.gens[b] = online;
      this.availableW[b] = perGen * cap;
    }
  }

  /** Connect every generator that is not tripped (a planned start before a heavy load). */
  connectAll(tS: number): void {
    for (let b = 0; b < this.nBus; b++) {
      const g0 = b * GENS_PER_BUS;
      for (let g = this.firstOffline(g0, tS); g >= 0; g = this.firstOffline(g0, tS)) {
        this.genOn[g] = 1;
        this.gens[b] = this.gens[b]! + 1;
      }
      this.lowS[b] = 0;
    }
  }

  /** The first generator of the section (from g0) that is off and not tripped; −1 when none. */
  private firstOffline(g0: number, tS: number): number {
    for (let g = g0; g < g0 + GENS_PER_BUS; g++) if (!this.genOn[g] && tS >= this.tripUntil[g]!) return g;
    return -1;
  }

  /**
   * Power limit: from the commanded thrusts of the running units predict each
   * bus's demand with the nominal thruster model (the DP does not know of
   * fouling) and set scale[b] so that demand fits. Read scale / limitActive.
   */
  limit(specs: readonly ThrusterSpec[], cmdThrust: Float64Array, running: Uint8Array): void {
    // Thrust-dependent power P_rated (1 − idle) f^(3/2) per unit (f = T/T_max); hotel load and running losses are fixed.
    this.demand.fill(0);
    this.fixed.set(this.hotelW);
    for (let i = 0; i < specs.length; i++) {
      if (!running[i]) continue;
      const s = specs[i]!;
      const t = cmdThrust[i]!;
      let frac = t >= 0 ? t / s.maxThrust : -t / s.maxReverse;
      if (frac > 1) frac = 1;
      this.demand[s.bus] = this.demand[s.bus]! + s.ratedW * (1 - s.idle) * frac * Math.sqrt(frac);
      this.fixed[s.bus] = this.fixed[s.bus]! + s.ratedW * s.idle;
    }
    for (let b = 0; b < this.nBus; b++) {
      const room = RESERVE * this.availableW[b]! - this.fixed[b]!;
      const d = this.demand[b]!;
      if (d > 0 && (d > room || (this.limitActive[b] && (d > RELEASE * room || this.limitRun[b]! < HOLD_S)))) {
        this.scale[b] = powerLimitScale(d, room);
        this.limitActive[b] = 1;
        this.limitRun[b] = this.limitRun[b]! + 1;
      } else {
        this.scale[b] = 1;
        this.limitActive[b] = 0;
        this.limitRun[b] = 0;
      }
      this.loadW[b] = this.fixed[b]! + d;
    }
  }
}

/** Thrust scale so that power P ∝ T^(3/2) drops from `demandW` to `roomW`. */
export function powerLimitScale(demandW: number, roomW: number): number {
  return demandW <= roomW ? 1 : roomW <= 0 ? 0 : (roomW / demandW) ** (2 / 3);
}
