import type { FleetFile, FleetVessel } from '../lib/register/fleetFile';
import type { PowerRecord, RefsRecord, StationRecord, ThrustersRecord } from '../lib/telemetry/schemas';
import { Random } from '../seed/random';

/**
 * Generated benchmark traffic: vessels with 8 thrusters, 2 buses and 3
 * reference systems sending 1-minute statistics — 14 table rows per interval.
 */
export const ROWS_PER_INTERVAL = 1 + 8 + 2 + 3;

export function benchFleet(vessels: number, tag: string): FleetFile {
  const list: FleetVessel[] = Array.from({ length: vessels }, (_, i) => ({
    key: `bench-${tag}-${i}`,
    name: `Bench ${i}`,
    type: 'construction',
    dp_class: 2,
    watch_circles_m: [3, 5],
    heading_limits_deg: [3, 5],
    thrusters: Array.from({ length: 8 }, (_, k) => ({
      id: `T${k + 1}`,
      kind: k < 4 ? 'tunnel' : 'azimuth',
      rated_kw: 2000,
      diameter_m: 2.4,
      life_exponent: 3,
      service_interval_h: 20000,
      wear_h_at_install: 0,
    })),
    buses: [
      { id: 'A', rated_kw: 8000 },
      { id: 'B', rated_kw: 8000 },
    ],
    refs: [
      { id: 'GNSS1', kind: 'gnss' },
      { id: 'GNSS2', kind: 'gnss' },
      { id: 'HPR1', kind: 'hydroacoustic' },
    ],
  }));
  return { v: 1, vessels: list, campaigns: [] };
}

export interface IntervalRecords {
  station: StationRecord;
  thrusters: ThrustersRecord;
  power: PowerRecord;
  refs: RefsRecord;
}

/** One vessel's records of the interval starting at tMs (cheap to make, realistic in size). */
export function benchInterval(tMs: number, rng: Random): IntervalRecords {
  const t = new Date(tMs).toISOString();
  const dt = 60;
  const hist = [2, 5, 9, 12, 10, 8, 6, 4, 2, 1, 1];
  return {
    station: {
      v: 1, t, dt, mode: 'auto_position', dp_s: 60, n: 60,
      sp: { lat: 59.41, lon: 2.87, hdg: 215 },
      err: { north_mean: rng.normal() * 0.2, east_mean: rng.normal() * 0.2, r_mean: 0.4, r_rms: 0.45, r_max: 1.1, hist },
      hdg_err: { mean: 0.01, rms: 0.3, max_abs: 0.9 },
      env: { wind_ms: 9.5, wind_gust_ms: 12.1, wind_from_deg: 230, current_ms: 0.4, current_to_deg: 300 },
    },
    thrusters: {
      v: 1, t, dt,
      units: Array.from({ length: 8 }, (_, k) => ({
        id: `T${k + 1}`, run_s: 60, starts: 0, rpm: 150, load_pct_mean: 35.5, load_pct_max: 48.2,
        thrust_kn: 140.2, power_kw: 710, azimuth_travel_deg: 4.5,
        load_band_s: [0, 0, 10, 30, 20, 0, 0, 0, 0, 0, 0],
      })),
    },
    power: {
      v: 1, t, dt,
      buses: ['A', 'B'].map((id) => ({ id, kw_mean: 3100, kw_max: 3900, kw_available: 6000, gens_online: 2, limit_s: 0, limit_events: 0, blackout: false })),
    },
    refs: {
      v: 1, t, dt,
      systems: ['GNSS1', 'GNSS2', 'HPR1'].map((id) => ({ id, kind: id.startsWith('G') ? ('gnss' as const) : ('hydroacoustic' as const), online_s: 60, weight: 0.33, sd_m: 0.3, rejected: 0 })),
    },
  };
}
