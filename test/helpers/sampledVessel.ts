import { Random } from '../../seed/random';
import type { GeneratedSpan } from './randomTelemetry';
import type { PowerRecord, RefsRecord, StationRecord, ThrustersRecord } from '../../lib/telemetry/schemas';

/**
 * A vessel's 1 Hz samples, invented for the daily-figures integration test,
 * and the contract's per-interval records reduced from them the way an
 * onboard gateway would. The test then computes each daily figure straight
 * from the samples (expectedDay.ts), independently of lib/metrics, and
 * compares it with what came back through MQTT → ingest → job → API.
 *
 * Kept simple where the contract allows: one DP mode per interval, one
 * running state per thruster per interval, bands by instantaneous load.
 */

export interface SampledVesselOptions extends GeneratedSpan {
  /** Position error standard deviation per axis, m (circular normal: Rayleigh radial error). */
  sigmaM: number;
}

export interface Samples {
  /** Per second. */
  t: Float64Array;
  dp: Uint8Array;
  r: Float64Array;
  hdgErr: Float64Array;
  wind: Float64Array;
  current: Float64Array;
  /** Per thruster, per second: load % of rated (0 when stopped), thrust kN, power kW. */
  load: Float64Array[];
  running: Uint8Array[];
  thrust: Float64Array[];
  power: Float64Array[];
  /** Per bus, per second. */
  kw: Float64Array[];
  kwAvailable: Float64Array[];
  limited: Uint8Array[];
  blackout: Uint8Array[];
}

export interface SampledVessel {
  samples: Samples;
  station: StationRecord[];
  thrusters: ThrustersRecord[];
  power: PowerRecord[];
  refs: RefsRecord[];
}

const RATED_KW = 2000;

export function sampledVessel(o: SampledVesselOptions): SampledVessel {
  const rnd = new Random(o.seed);
  const n = o.intervals * o.dt;
  const f64 = () => new Float64Array(n);
  const u8 = () => new Uint8Array(n);
  const s: Samples = {
    t: f64(), dp: u8(), r: f64(), hdgErr: f64(), wind: f64(), current: f64(),
    load: o.thrusters.map(f64), running: o.thrusters.map(u8), thrust: o.thrusters.map(f64), power: o.thrusters.map(f64),
    kw: o.buses.map(f64), kwAvailable: o.buses.map(f64), limited: o.buses.map(u8), blackout: o.buses.map(u8),
  };
  const out: SampledVessel = { samples: s, station: [], thrusters: [], power: [], refs: [] };
  let windLevel = 8;
  const limitedBefore = o.buses.map(() => 0);
  const runningBefore = o.thrusters.map(() => 0);

  for (let i = 0; i < o.intervals; i++) {
    const i0 = i * o.dt;
    const t = new Date(o.from.getTime() + i0 * 1000).toISOString();
    const dp = rnd.next() < 0.85 ? 1 : 0;
    const sigma = o.sigmaM * (0.7 + 0.6 * rnd.next());
    const hist: number[] = new Array(101).fill(0);
    let rSum = 0, rSq = 0, rMax = 0, hSq = 0, hMax = 0, hSum = 0, wSum = 0, cSum = 0, gust = 0;
    windLevel = Math.max(1, windLevel + rnd.normal());
    for (let k = 0; k < o.dt; k++) {
      const j = i0 + k;
      s.t[j] = o.from.getTime() + j * 1000;
      s.dp[j] = dp;
      const north = sigma * rnd.normal();
      const east = sigma * rnd.normal();
      const r = Math.hypot(north, east);
      s.r[j] = r;
      s.hdgErr[j] = 0.3 * rnd.normal();
      s.wind[j] = Math.max(0, windLevel + 1.5 * rnd.normal());
      s.current[j] = 0.4 + 0.05 * rnd.normal();
      hist[Math.min(100, Math.floor(r * 10))]!++;
      rSum += r; rSq += r * r; rMax = Math.max(rMax, r);
      hSum += s.hdgErr[j]!; hSq += s.hdgErr[j]! ** 2; hMax = Math.max(hMax, Math.abs(s.hdgErr[j]!));
      wSum += s.wind[j]!; cSum += s.current[j]!;
      if (k >= 2) gust = Math.max(gust, (s.wind[j]! + s.wind[j - 1]! + s.wind[j - 2]!) / 3);
    }
    while (hist.length > 1 && hist[hist.length - 1] === 0) hist.pop();
    out.station.push({
      v: 1, t, dt: o.dt,
      mode: dp ? 'auto_position' : 'joystick',
      dp_s: dp ? o.dt : 0,
      n: o.dt,
      err: { r_mean: rSum / o.dt, r_rms: Math.sqrt(rSq / o.dt), r_max: rMax, hist },
      hdg_err: { mean: hSum / o.dt, rms: Math.sqrt(hSq / o.dt), max_abs: hMax },
      env: { wind_ms: wSum / o.dt, wind_gust_ms: gust, current_ms: cSum / o.dt },
    });

    out.thrusters.push({
      v: 1, t, dt: o.dt,
      units: o.thrusters.map((id, u) => {
        const running = rnd.next() < 0.9 ? 1 : 0;
        const base = 10 + 70 * rnd.next();
        const bands = new Array(11).fill(0);
        let thrustSum = 0, powerSum = 0, loadSum = 0;
        for (let k = 0; k < o.dt; k++) {
          const j = i0 + k;
          s.running[u]![j] = running;
          if (!running) continue;
          const load = Math.max(0, base + 15 * rnd.normal()); // may exceed 100 % briefly
          const power = (load / 100) * RATED_KW;
          const thrust = 0.9 * 1.1721 * (2.4 * power) ** (2 / 3); // kN; the spec's ideal-thrust form, derated (invented)
          s.load[u]![j] = load; s.power[u]![j] = power; s.thrust[u]![j] = thrust;
          bands[Math.min(10, Math.floor(load / 10))]++;
          thrustSum += thrust; powerSum += power; loadSum += load;
        }
        const starts = running && !runningBefore[u] ? 1 : 0;
        runningBefore[u] = running;
        const runS = running ? o.dt : 0;
        return running
          ? { id, run_s: runS, starts, load_pct_mean: loadSum / o.dt, thrust_kn: thrustSum / o.dt, power_kw: powerSum / o.dt, load_band_s: bands }
          : { id, run_s: 0, starts: 0 };
      }),
    });

    out.power.push({
      v: 1, t, dt: o.dt,
      buses: o.buses.map((id, b) => {
        const available = rnd.next() < 0.03 ? 2500 : 6000;
        const blackout = rnd.next() < 0.01 ? 1 : 0;
        let kwSum = 0, kwMax = 0, limitS = 0, events = 0;
        for (let k = 0; k < o.dt; k++) {
          const j = i0 + k;
          const kw = Math.max(0, 2400 + 400 * rnd.normal());
          const limited = kw > 0.9 * available ? 1 : 0;
          s.kw[b]![j] = kw; s.kwAvailable[b]![j] = available; s.limited[b]![j] = limited; s.blackout[b]![j] = blackout;
          if (limited && !limitedBefore[b]) events++;
          limitedBefore[b] = limited;
          kwSum += kw; kwMax = Math.max(kwMax, kw); limitS += limited;
        }
        return { id, kw_mean: kwSum / o.dt, kw_max: kwMax, kw_available: available, gens_online: available > 3000 ? 2 : 1, limit_s: limitS, limit_events: events, blackout: blackout === 1 };
      }),
    });

    out.refs.push({
      v: 1, t, dt: o.dt,
      systems: o.refs.map((id, k) => {
        const online = rnd.next() < 0.9 ? o.dt : Math.floor(o.dt * rnd.next());
        return { id, kind: k === 0 ? 'gnss' : 'hydroacoustic', online_s: online, weight: 0.2 + 0.6 * rnd.next(), sd_m: 0.1 + 0.5 * rnd.next(), rejected: rnd.next() < 0.1 ? 1 : 0 };
      }),
    });
  }
  return out;
}
