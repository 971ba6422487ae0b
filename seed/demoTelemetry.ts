import type { FleetVessel } from '../lib/register/fleetFile';
import { latLonFromOffset } from '../lib/geo/wgs84';
import type { PowerRecord, RefsRecord, StationRecord, ThrustersRecord, TrackRecord } from '../lib/telemetry/schemas';
import { headingErrorStats, positionErrorStats, round } from './intervalStatistics';
import { Random, seedOf } from './random';
import type { DemoSite } from './sites';

/**
 * A statistical generator of contract-valid demo telemetry. Position error per
 * axis is a first-order Gauss–Markov process (time constant TAU_S) whose
 * standard deviation grows with wind; thruster load follows the wind; thrust
 * follows ideal momentum theory, T = (2·ρ·A·P²)^(1/3), derated by
 * THRUST_EFFICIENCY. It makes believable demo data, nothing more.
 */

const TAU_S = 30;
const RHO_SEA = 1025; // kg/m³, typical sea water density (from memory)
const THRUST_EFFICIENCY = 0.7; // fraction of ideal bollard thrust (common practice, no source)
const HOTEL_KW = 400;
const REF_SD_M: Record<string, number> = { gnss: 0.35, hydroacoustic: 0.6, laser: 0.12, radar: 0.45, taut_wire: 0.25, other: 0.5 };

export interface DemoRecords {
  /** 1 Hz positions of the interval (telemetry-v1 `track`): true position = set point + error. */
  track: TrackRecord[];
  station: StationRecord;
  thrusters: ThrustersRecord;
  power: PowerRecord;
  refs: RefsRecord;
}

/** Wind speed (m/s) at an instant: a slow multi-day swell of weather plus gusts. */
function windAt(ms: number, phase: number, rng: Random): number {
  const days = ms / 86_400_000;
  const w = 8 + 5 * Math.sin(2 * Math.PI * (days / 3.1) + phase) + 2 * Math.sin(2 * Math.PI * days + phase * 2);
  return Math.max(0.5, w + rng.normal() * 0.8);
}

export class DemoVessel {
  private readonly rng: Random;
  private north = 0;
  private east = 0;
  private readonly phase: number;

  constructor(
    readonly vessel: FleetVessel,
    private readonly site: DemoSite,
  ) {
    this.rng = new Random(seedOf(vessel.key));
    this.phase = this.rng.next() * 2 * Math.PI;
  }

  /** The records of the interval [t, t + dt). Call with increasing t. */
  interval(tMs: number, dt: number): DemoRecords {
    const t = new Date(tMs).toISOString();
    const rng = this.rng;
    const wind = windAt(tMs, this.phase, rng);
    // Supply vessels leave DP for a few hours each day (transit, port calls).
    const hourUtc = new Date(tMs).getUTCHours();
    const inDp = !(this.vessel.type === 'supply' && hourUtc >= 1 && hourUtc < 4);

    const sigma = 0.2 + 0.045 * wind;
    const a = Math.exp(-1 / TAU_S);
    const kick = Math.sqrt(1 - a * a) * sigma;
    const north: number[] = [];
    const east: number[] = [];
    const heading: number[] = [];
    for (let i = 0; i < dt; i++) {
      this.north = a * this.north + kick * rng.normal();
      this.east = a * this.east + kick * rng.normal();
      north.push(this.north);
      east.push(this.east);
      heading.push(rng.normal() * (0.15 + 0.03 * wind));
    }
    const gust = wind * (1.25 + 0.1 * rng.next());

    const station: StationRecord = {
      v: 1,
      t,
      dt,
      mode: inDp ? 'auto_position' : 'standby',
      dp_s: inDp ? dt : 0,
      n: dt,
      sp: { lat: this.site.lat, lon: this.site.lon, hdg: this.site.heading },
      err: positionErrorStats(north, east),
      hdg_err: headingErrorStats(heading),
      env: {
        wind_ms: round(wind, 2),
        wind_gust_ms: round(gust, 2),
        wind_from_deg: round((this.site.heading + 20 + rng.normal() * 10 + 360) % 360, 1),
        current_ms: round(0.3 + 0.2 * Math.sin(tMs / 22_357_000 + this.phase), 2),
        current_to_deg: round((this.site.heading + 90 + 360) % 360, 1),
      },
    };

    const buses = this.vessel.buses;
    const busLoad = new Map<string, { mean: number; max: number }>(buses.map((b) => [b.id, { mean: HOTEL_KW / buses.length, max: HOTEL_KW / buses.length }]));
    const units = this.vessel.thrusters.map((th, i) => {
      const running = inDp || th.kind === 'main';
      if (!running) return { id: th.id, run_s: 0, starts: 0 };
      const meanLoad = Math.min(105, Math.max(3, 12 + 2.2 * wind + rng.normal() * 3));
      const bands = new Array<number>(11).fill(0);
      let maxLoad = 0;
      for (let s = 0; s < dt; s++) {
        const load = Math.max(0, meanLoad + rng.normal() * 4);
        maxLoad = Math.max(maxLoad, load);
        bands[Math.min(10, Math.floor(load / 10))]! += 1;
      }
      const powerKw = (meanLoad / 100) * th.rated_kw;
      const area = th.diameter_m ? (Math.PI * th.diameter_m ** 2) / 4 : 3;
      const thrustKn = (THRUST_EFFICIENCY * Math.cbrt(2 * RHO_SEA * area * (powerKw * 1000) ** 2)) / 1000;
      const bus = buses.length ? busLoad.get(buses[i % buses.length]!.id)! : undefined;
      if (bus) {
        bus.mean += powerKw;
        bus.max += (maxLoad / 100) * th.rated_kw;
      }
      return {
        id: th.id,
        run_s: dt,
        starts: 0,
        rpm: round(80 + meanLoad * 1.5, 1),
        load_pct_mean: round(meanLoad, 2),
        load_pct_max: round(maxLoad, 2),
        thrust_kn: round(thrustKn, 2),
        power_kw: round(powerKw, 1),
        ...(th.kind === 'azimuth' ? { azimuth_deg: round((rng.next() * 360) % 360, 1), azimuth_travel_deg: round(Math.abs(rng.normal()) * 20, 1) } : {}),
        load_band_s: bands,
      };
    });

    const power: PowerRecord = {
      v: 1,
      t,
      dt,
      buses: buses.map((b) => {
        const load = busLoad.get(b.id)!;
        const available = b.rated_kw * 0.75;
        const limited = load.max > 0.95 * available;
        return {
          id: b.id,
          kw_mean: round(load.mean, 1),
          kw_max: round(load.max, 1),
          kw_available: round(available, 1),
          gens_online: 2,
          limit_s: limited ? Math.min(dt, 5) : 0,
          limit_events: limited ? 1 : 0,
          blackout: false,
        };
      }),
    };

    const refs: RefsRecord = {
      v: 1,
      t,
      dt,
      systems: this.vessel.refs.map((r) => ({
        id: r.id,
        kind: r.kind,
        online_s: inDp ? dt : 0,
        weight: round(1 / this.vessel.refs.length, 3),
        sd_m: round(REF_SD_M[r.kind]! * (1 + 0.1 * Math.abs(rng.normal())), 3),
        rejected: rng.next() < 0.002 ? 1 : 0,
      })),
    };

    const track: TrackRecord[] = north.map((n, i) => {
      const p = latLonFromOffset(this.site.lat, this.site.lon, n, east[i]!);
      return {
        v: 1,
        t: new Date(tMs + i * 1000).toISOString(),
        lat: round(p.lat, 7),
        lon: round(p.lon, 7),
        hdg: round((this.site.heading + heading[i]! + 360) % 360, 2),
        sp_lat: this.site.lat,
        sp_lon: this.site.lon,
        sp_hdg: this.site.heading,
      };
    });

    return { track, station, thrusters: { v: 1, t, dt, units }, power, refs };
  }
}
