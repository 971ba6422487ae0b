import type { FleetVessel } from '../../lib/register/fleetFile';
import { Random } from '../random';
import type { ThrusterSpec } from './thrusters';

/**
 * Switchboard sections for the demo simulator (demo data only). Each bus has
 * two generators sharing its rated power (invented arrangement); hotel load
 * is spread over the buses. A generator trips now and then (mean time between
 * trips MTBT_S, back after a random 5–30 min; invented rates) which halves the
 * section's capacity. The power limit (a "fast load reduction", Sørensen 2011
 * §4.6) scales the commanded thrust of that section's units so their power,
 * P ∝ T^(3/2) (from T ∝ n², P ∝ n³), fits the available power less a reserve.
 */

const GENS_PER_BUS = 2;
const HOTEL_KW = 400; // invented
const RESERVE = 0.95; // use at most 95 % of online capacity (common practice, no source)
/** Running loss at zero thrust as a fraction of rated power (invented; same as thrusters.ts). */
const IDLE = 0.02;
const MTBT_S = 4 * 86_400; // per bus, invented

export class PowerPlant {
  readonly nBus: number;
  readonly ratedW: Float64Array;
  readonly gens: Int32Array;
  readonly availableW: Float64Array;
  readonly hotelW: Float64Array;
  /** Thrust scale per bus for the next step (1 = no limit). */
  readonly scale: Float64Array;
  readonly limitActive: Uint8Array;
  private readonly tripUntil: Float64Array;
  private readonly demand: Float64Array;
  private readonly fixed: Float64Array;

  constructor(vessel: FleetVessel, private readonly rng: Random) {
    this.nBus = Math.max(1, vessel.buses.length);
    this.ratedW = Float64Array.from(vessel.buses.length ? vessel.buses.map((b) => b.rated_kw * 1000) : [1e7]);
    this.gens = new Int32Array(this.nBus).fill(GENS_PER_BUS);
    this.availableW = Float64Array.from(this.ratedW);
    this.hotelW = new Float64Array(this.nBus).fill((HOTEL_KW * 1000) / this.nBus);
    this.scale = new Float64Array(this.nBus).fill(1);
    this.limitActive = new Uint8Array(this.nBus);
    this.tripUntil = new Float64Array(this.nBus);
    this.demand = new Float64Array(this.nBus);
    this.fixed = new Float64Array(this.nBus);
  }

  /** Generator trips and returns at time tS (s). */
  stepGenerators(tS: number, tripsEnabled = true): void {
    for (let b = 0; b < this.nBus; b++) {
      if (this.gens[b]! < GENS_PER_BUS && tS >= this.tripUntil[b]!) this.gens[b] = GENS_PER_BUS;
      else if (tripsEnabled && this.gens[b] === GENS_PER_BUS && this.rng.next() < 1 / MTBT_S) {
        this.gens[b] = GENS_PER_BUS - 1;
        this.tripUntil[b] = tS + 300 + this.rng.next() * 1500;
      }
      this.availableW[b] = (this.ratedW[b]! * this.gens[b]!) / GENS_PER_BUS;
    }
  }

  /**
   * Power limit: from the commanded thrusts predict each bus's demand and set
   * scale[b] so that demand fits. Returns nothing; read scale / limitActive.
   */
  limit(specs: readonly ThrusterSpec[], cmdThrust: Float64Array): void {
    // Thrust-dependent power P_rated (1 − IDLE) f^(3/2) per unit (f = T/T_max); hotel load and running losses are fixed.
    this.demand.fill(0);
    this.fixed.set(this.hotelW);
    for (let i = 0; i < specs.length; i++) {
      const s = specs[i]!;
      const t = cmdThrust[i]!;
      let frac = t >= 0 ? t / s.maxThrust : -t / s.maxReverse;
      if (frac > 1) frac = 1;
      this.demand[s.bus] = this.demand[s.bus]! + s.ratedW * (1 - IDLE) * frac * Math.sqrt(frac);
      this.fixed[s.bus] = this.fixed[s.bus]! + s.ratedW * IDLE;
    }
    for (let b = 0; b < this.nBus; b++) {
      const room = RESERVE * this.availableW[b]! - this.fixed[b]!;
      const d = this.demand[b]!;
      if (d > room && d > 0) {
        this.scale[b] = powerLimitScale(d, room);
        this.limitActive[b] = 1;
      } else {
        this.scale[b] = 1;
        this.limitActive[b] = 0;
      }
    }
  }
}

/** Thrust scale so that power P ∝ T^(3/2) drops from `demandW` to `roomW`. */
export function powerLimitScale(demandW: number, roomW: number): number {
  return demandW <= roomW ? 1 : roomW <= 0 ? 0 : (roomW / demandW) ** (2 / 3);
}
