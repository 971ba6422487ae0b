import { addDays } from '../../time/fleetDay';
import type { TruthEntry } from './score';

/**
 * Daily figures of an invented fleet with known faults, for the flag job's
 * quick evaluation (test/flagsEval.test.ts): the daily tables as the daily
 * job would have filled them, without simulating telemetry. The faults
 * mirror the demo simulator's (seed/scenarios/plan.ts) in what they do to
 * the daily series, at rates and noise levels read off a simulated fleet
 * (docs/flags.md "Evaluation"):
 *
 *   fouling        one thruster's efficiency_index falls 1 % a day
 *   ref noise      one reference system's sd_m_median grows 8 % of nominal a day
 *   derate         limit events appear from onset (the simulator's derating
 *                  starts with a step) and grow
 *   detune         p95_norm and heading RMS grow 2.5 % a day
 *   weather only   the mean wind grows 1.5 % a day (to +50 %): raw p95 and the
 *                  limit events follow the weather, p95_norm does not
 *
 * Healthy series carry day-to-day noise, weather that persists for days
 * (AR(1)), and for limit events the odd burst, so that a method that flags
 * noise is caught. Pure and seeded: the same seed gives the same fleet.
 */

/** xorshift32 (G. Marsaglia, "Xorshift RNGs", J. Statistical Software 8 (14), 2003). */
class Rng {
  private x: number;
  constructor(seed: number) {
    this.x = seed >>> 0 || 0x9e3779b9;
  }
  next(): number {
    let x = this.x;
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    this.x = x >>> 0;
    return this.x / 4_294_967_296;
  }
  /** Standard normal by the Box–Muller transform (Box and Muller, Ann. Math. Statist. 29 (1958) 610–611). */
  normal(): number {
    const u = Math.max(this.next(), 1e-12);
    return Math.sqrt(-2 * Math.log(u)) * Math.cos(2 * Math.PI * this.next());
  }
}

export interface SyntheticVesselDay {
  vessel: string;
  day: string;
  p95_norm: number;
  p95_m: number;
  hdg_rms_deg: number;
  wind_mean_ms: number;
  limit_events_per_dp_day: number;
}
export interface SyntheticUnitDay {
  vessel: string;
  unit: string;
  day: string;
  efficiency_index?: number;
  sd_m_median?: number;
  rejections?: number;
}

export interface SyntheticFleet {
  from: string;
  days: number;
  vessels: string[];
  vesselDays: SyntheticVesselDay[];
  thrusterDays: SyntheticUnitDay[];
  refDays: SyntheticUnitDay[];
  truth: TruthEntry[];
}

export const THRUSTERS = ['T1', 'T2', 'T3', 'T4'];
export const REFS = ['GNSS1', 'GNSS2', 'HPR1'];
type Fault = 'fouling' | 'ref_noise' | 'derate' | 'detune' | 'weather_only' | 'none';

export function syntheticFleet(o: { seed: number; from: string; days: number; healthy: number; onsetDay: number }): SyntheticFleet {
  const rng = new Rng(o.seed);
  const faults: Fault[] = ['fouling', 'ref_noise', 'derate', 'detune', 'weather_only', ...Array<Fault>(o.healthy).fill('none')];
  const fleet: SyntheticFleet = { from: o.from, days: o.days, vessels: [], vesselDays: [], thrusterDays: [], refDays: [], truth: [] };
  const onsetDate = addDays(o.from, o.onsetDay);
  faults.forEach((fault, v) => {
    const vessel = `synth-${v + 1}`;
    fleet.vessels.push(vessel);
    const base = { scenario: fault, vessel, onset_date: onsetDate };
    if (fault === 'fouling') fleet.truth.push({ ...base, scenario: 'thruster_fouling', subject: 'thruster:T2', metric: 'efficiency_index', expect_flag: true });
    if (fault === 'ref_noise') fleet.truth.push({ ...base, scenario: 'reference_noise', subject: 'ref:GNSS2', metric: 'sd_m_median', expect_flag: true });
    if (fault === 'derate') fleet.truth.push({ ...base, scenario: 'generator_derate', subject: 'vessel', metric: 'limit_events_per_dp_day', expect_flag: true });
    if (fault === 'detune') {
      fleet.truth.push({ ...base, scenario: 'controller_detune', subject: 'vessel', metric: 'p95_norm', expect_flag: true });
      fleet.truth.push({ ...base, scenario: 'controller_detune', subject: 'vessel', metric: 'hdg_rms', expect_flag: true });
    }
    if (fault === 'weather_only') fleet.truth.push({ ...base, subject: 'vessel', metric: 'p95_norm', expect_flag: false });

    const effLevel = [1.75, 1.66, 1.7, 0.9].map((x) => x * (0.9 + 0.2 * rng.next()));
    const sdLevel = [0.17, 0.21, 0.55];
    let weather = 0;
    for (let d = 0; d < o.days; d++) {
      const day = addDays(o.from, d);
      const since = Math.max(0, d - o.onsetDay);
      // Weather persists for days: AR(1) with lag-one correlation 0.6, stationary sd 1.
      weather = 0.6 * weather + Math.sqrt(1 - 0.36) * rng.normal();
      const windScale = fault === 'weather_only' ? 1 + Math.min(0.015 * since, 0.5) : 1;
      const wind = Math.max(0.5, (8 + 3 * weather) * windScale);
      const load = (wind / 8) ** 2;
      const detune = fault === 'detune' ? 1 + 0.025 * since : 1;
      const p95Norm = detune * Math.exp(0.12 * rng.normal());
      // A derated section: tens to hundreds of events per DP day, with the load (the simulator's 40 % step: 14–620).
      const derated = fault === 'derate' && d >= o.onsetDay;
      const events = derated ? 60 * load * (1 + 0.05 * since) * Math.exp(0.8 * rng.normal()) : rng.next() < 0.04 ? 3 + 20 * rng.next() * load : 0;
      fleet.vesselDays.push({
        vessel,
        day,
        p95_norm: p95Norm,
        p95_m: 0.2 * (1 + 0.4 * load) * p95Norm,
        hdg_rms_deg: 0.14 * detune * Math.exp(0.25 * rng.normal()),
        wind_mean_ms: wind,
        limit_events_per_dp_day: events,
      });
      THRUSTERS.forEach((unit, i) => {
        const fouled = fault === 'fouling' && unit === 'T2' ? 1 - Math.min(0.01 * since, 0.4) : 1;
        // Efficiency moves with the operating point (weather), ±2 %, plus 0.5 % noise.
        const eff = effLevel[i]! * fouled * (1 - 0.02 * weather) * (1 + 0.005 * rng.normal());
        fleet.thrusterDays.push({ vessel, unit, day, efficiency_index: eff });
      });
      REFS.forEach((unit, i) => {
        const noisy = fault === 'ref_noise' && unit === 'GNSS2' ? Math.min(1 + 0.08 * since, 4) : 1;
        const rate = unit === 'HPR1' ? 30 : 5;
        fleet.refDays.push({
          vessel,
          unit,
          day,
          sd_m_median: sdLevel[i]! * noisy * (1 + 0.01 * rng.normal()),
          rejections: Math.max(0, Math.round(rate + Math.sqrt(rate) * rng.normal())),
        });
      });
    }
  });
  return fleet;
}
