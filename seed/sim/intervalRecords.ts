import { latLonFromOffset } from '../../lib/geo/wgs84';
import type { PowerRecord, RefsRecord, StationRecord, ThrustersRecord, TrackRecord } from '../../lib/telemetry/schemas';
import type { DemoSite } from '../sites';
import { round } from '../intervalStatistics';
import { DEG, deg360 } from './constants';
import type { ReferenceSystems } from './references';
import type { ThrusterSpec } from './thrusters';
import type { VesselState } from './vesselModel';

/**
 * The per-unit parts of an interval's records, from the sums the 1 Hz loop
 * keeps in typed arrays (index = unit; `bands` holds 11 load bands per unit).
 */
export interface ThrusterSums {
  run: Float64Array;
  rpm: Float64Array;
  /** Σ pitch % (controllable-pitch units; their speed is constant). */
  pitch: Float64Array;
  loadMax: Float64Array;
  thrust: Float64Array;
  power: Float64Array;
  cos: Float64Array;
  sin: Float64Array;
  travel: Float64Array;
  bands: Float64Array;
}

export interface BusSums {
  kw: Float64Array;
  kwMax: Float64Array;
  avail: Float64Array;
  limitS: Float64Array;
  events: Int32Array;
}

export function reduceThrusters(specs: readonly ThrusterSpec[], u: ThrusterSums, starts: Int32Array): ThrustersRecord['units'] {
  const units: ThrustersRecord['units'] = [];
  for (let k = 0; k < specs.length; k++) {
    const sp = specs[k]!;
    const run = u.run[k]!;
    if (run === 0) {
      units.push({ id: sp.id, run_s: 0, starts: starts[k]! });
      continue;
    }
    // Built field by field in the record's order (no spread objects: this runs 1,440 times a vessel-day).
    const unit: ThrustersRecord['units'][number] = { id: sp.id, run_s: run, starts: starts[k]!, rpm: round(sp.cpp ? sp.maxRpm : u.rpm[k]! / run, 1) };
    if (sp.cpp) unit.pitch_pct = round(u.pitch[k]! / run, 1);
    unit.load_pct_mean = round((100 * u.power[k]!) / run / sp.ratedW, 2);
    unit.load_pct_max = round(u.loadMax[k]!, 2);
    unit.thrust_kn = round(u.thrust[k]! / run / 1000, 2);
    unit.power_kw = round(u.power[k]! / run / 1000, 1);
    if (sp.azimuthing) {
      unit.azimuth_deg = round(deg360(Math.atan2(u.sin[k]!, u.cos[k]!)), 1) % 360;
      unit.azimuth_travel_deg = round(u.travel[k]! / DEG, 1);
    }
    unit.load_band_s = Array.from(u.bands.subarray(k * 11, k * 11 + 11));
    units.push(unit);
  }
  return units;
}

export function reduceBuses(ids: readonly string[], b: BusSums, gensOnline: Int32Array, dt: number): PowerRecord['buses'] {
  return ids.map((id, k) => ({
    id,
    kw_mean: round(b.kw[k]! / dt, 1),
    kw_max: round(b.kwMax[k]!, 1),
    kw_available: round(b.avail[k]! / dt, 1),
    gens_online: gensOnline[k]!,
    limit_s: b.limitS[k]!,
    limit_events: b.events[k]!,
    blackout: false,
  }));
}

/** Reference systems: sd_m is the standard deviation of the residual (needs ≥ 2 samples). */
export function reduceReferences(refs: ReferenceSystems, dt: number): RefsRecord['systems'] {
  return refs.ids.map((id, k) => {
    const n = refs.resCount[k]!;
    let sd: number | undefined;
    if (n >= 2) {
      const vn = Math.max(0, refs.resN2[k]! / n - (refs.resN[k]! / n) ** 2);
      const ve = Math.max(0, refs.resE2[k]! / n - (refs.resE[k]! / n) ** 2);
      sd = round(Math.sqrt((vn + ve) / 2), 3);
    }
    return {
      id,
      kind: refs.kinds[k]!,
      online_s: refs.onlineS[k]!,
      weight: round(refs.weightSum[k]! / dt, 3),
      ...(sd !== undefined ? { sd_m: sd } : {}),
      rejected: refs.rejected[k]!,
    };
  });
}

/** Position `north`, `east` m from the site, rounded to 1e-7° (about 1 cm). */
function position(site: DemoSite, north: number, east: number): { lat: number; lon: number } {
  const p = latLonFromOffset(site.lat, site.lon, north, east);
  return { lat: round(p.lat, 7), lon: round(p.lon, 7) };
}

/** The station record's set point (heading in radians in, degrees out). */
export function setPointOf(site: DemoSite, spN: number, spE: number, spHdg: number): NonNullable<StationRecord['sp']> {
  return { ...position(site, spN, spE), hdg: round(deg360(spHdg), 2) % 360 };
}

/** One 1 Hz `track` record: the true position and its set point. */
export function trackRecord(site: DemoSite, ms: number, state: VesselState, spN: number, spE: number, spHdg: number): TrackRecord {
  const here = position(site, state.north, state.east);
  const sp = setPointOf(site, spN, spE, spHdg);
  return {
    v: 1,
    t: new Date(ms).toISOString(),
    lat: here.lat,
    lon: here.lon,
    hdg: round(deg360(state.psi), 2) % 360,
    sp_lat: sp.lat,
    sp_lon: sp.lon,
    sp_hdg: sp.hdg,
  };
}
