import { Random } from '../../seed/random';
import type { PowerRecord, RefsRecord, StationRecord, ThrustersRecord } from '../../lib/telemetry/schemas';

/**
 * Random but valid telemetry-v1 records for one vessel over a time span, for
 * the daily-job tests and bench:jobs. Not physics (seed/ has the simulator):
 * every field varies independently, optional fields go missing with
 * probability `gap`, modes and blackouts occur, so each skip rule of the
 * metrics is exercised. Values are rounded to 32-bit floats (Math.fround),
 * the precision the store keeps, so a test can compare exactly what it
 * computes from these records with what the job computes from stored rows.
 */

/** A generated vessel's time span and unit ids (shared by the test generators). */
export interface GeneratedSpan {
  seed: number;
  /** First interval start (UTC). */
  from: Date;
  /** Number of intervals. */
  intervals: number;
  /** Interval length, s. */
  dt: number;
  thrusters: readonly string[];
  buses: readonly string[];
  refs: readonly string[];
}

export interface RandomTelemetryOptions extends GeneratedSpan {
  /** Probability that an optional field is left out. */
  gap?: number;
}

export interface RandomTelemetry {
  station: StationRecord[];
  thrusters: ThrustersRecord[];
  power: PowerRecord[];
  refs: RefsRecord[];
}

const MODES = ['auto_position', 'auto_position', 'auto_position', 'auto_position', 'auto_track', 'joystick', 'standby'] as const;
const f = Math.fround;

export function randomTelemetry(o: RandomTelemetryOptions): RandomTelemetry {
  const rnd = new Random(o.seed);
  const gap = o.gap ?? 0.1;
  const has = () => rnd.next() >= gap;
  const opt = <T>(v: T): T | undefined => (has() ? v : undefined);
  const out: RandomTelemetry = { station: [], thrusters: [], power: [], refs: [] };
  const wind = 4 + 10 * rnd.next();
  for (let i = 0; i < o.intervals; i++) {
    const t = new Date(o.from.getTime() + i * o.dt * 1000).toISOString();
    const base = { v: 1 as const, t, dt: o.dt };
    const mode = MODES[Math.floor(rnd.next() * MODES.length)]!;
    const bins = 5 + Math.floor(rnd.next() * (rnd.next() < 0.02 ? 96 : 35));
    const hist = Array.from({ length: bins }, () => Math.floor(rnd.next() * 9));
    if (rnd.next() < 0.01) hist[100] = 1 + Math.floor(rnd.next() * 3); // a few samples ≥ 10 m
    for (let k = 0; k < hist.length; k++) hist[k] ??= 0;
    const n = hist.reduce((a, b) => a + b, 0);
    const r = 0.3 + 2 * rnd.next();
    out.station.push({
      ...base,
      mode,
      dp_s: mode === 'auto_position' ? o.dt : f(o.dt * rnd.next() * 0.3),
      n,
      sp: has() ? { lat: 59.412, lon: 2.871, hdg: f(360 * rnd.next()) } : undefined,
      err: { r_mean: f(r * 0.9), r_rms: opt(f(r)), r_max: opt(f(r * 2.5)), hist: has() ? hist : undefined },
      hdg_err: has() ? { mean: f(rnd.normal() * 0.2), rms: opt(f(0.2 + rnd.next())), max_abs: opt(f(1 + 2 * rnd.next())) } : undefined,
      env: {
        wind_ms: opt(f(wind + rnd.normal())),
        wind_gust_ms: opt(f(wind * 1.4 + 2 * rnd.next())),
        wind_from_deg: opt(f(360 * rnd.next())),
        current_ms: opt(f(0.2 + 0.5 * rnd.next())),
      },
    } as StationRecord);
    out.thrusters.push({
      ...base,
      units: o.thrusters.map((id) => {
        const running = rnd.next() > 0.15;
        const run_s = running ? (rnd.next() < 0.8 ? o.dt : Math.floor(o.dt * rnd.next())) : 0;
        const load = 5 + 90 * rnd.next();
        const power = (load / 100) * 1500;
        // Random shares of run_s over all 11 bands (the ≥ 100 % band included), whole seconds.
        const weights = Array.from({ length: 11 }, () => rnd.next());
        const total = weights.reduce((a, b) => a + b, 0);
        const bands = weights.map((w) => Math.floor((run_s * w) / total));
        bands[Math.floor(rnd.next() * 11)]! += run_s - bands.reduce((a, b) => a + b, 0);
        return {
          id,
          run_s,
          starts: rnd.next() < 0.05 ? 1 : 0,
          load_pct_mean: running ? f(load) : undefined,
          thrust_kn: running ? opt(f(1.17 * (2 * power) ** (2 / 3) * (0.9 + 0.2 * rnd.next()))) : undefined,
          power_kw: running ? opt(f(power)) : undefined,
          azimuth_travel_deg: opt(f(360 * rnd.next())),
          load_band_s: running ? opt(bands) : undefined,
        };
      }),
    } as ThrustersRecord);
    out.power.push({
      ...base,
      buses: o.buses.map((id) => ({
        id,
        kw_mean: f(1500 + 1000 * rnd.next()),
        kw_max: opt(f(2500 + 1500 * rnd.next())),
        kw_available: opt(rnd.next() < 0.05 ? 0 : f(3000 + 1000 * rnd.next())),
        gens_online: 2,
        limit_s: opt(rnd.next() < 0.1 ? Math.floor(o.dt * rnd.next()) : 0),
        limit_events: opt(rnd.next() < 0.1 ? 1 + Math.floor(rnd.next() * 3) : 0),
        blackout: opt(rnd.next() < 0.01),
      })),
    } as PowerRecord);
    out.refs.push({
      ...base,
      systems: o.refs.map((id, k) => {
        const online = rnd.next() < 0.9 ? o.dt : Math.floor(o.dt * rnd.next());
        return {
          id,
          kind: k === 0 ? 'gnss' : 'hydroacoustic',
          online_s: opt(online),
          weight: opt(f(rnd.next())),
          sd_m: opt(f(0.1 + rnd.next())),
          rejected: opt(rnd.next() < 0.05 ? 1 : 0),
        };
      }),
    } as RefsRecord);
  }
  return out;
}
