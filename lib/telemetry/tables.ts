import { offsetFromSetPoint } from '../geo/wgs84';
import { copyArray as a, copyBoolean as b, copyNumber as n, copyText as s } from './copyText';
import type { Stream, TelemetryRecord, TrackRecord } from './schemas';

/**
 * How each stream's records become rows of its time-series table: the
 * table, its columns, and a record's rows as lines of COPY text in that
 * column order (vessel_id first; array columns as PostgreSQL array
 * literals). The lines are written straight from the record, without an
 * array of values per row: ingest renders every row it stores.
 */
export interface TableSpec<S extends Stream> {
  table: string;
  columns: readonly string[];
  /** The rows of one record as COPY text lines, each ended by a newline. */
  lines(vesselId: number, record: TelemetryRecord[S]): string;
}

/** Offsets from the set point, when the record names one (docs/telemetry.md). */
function trackOffset(r: TrackRecord): { north: number; east: number } | undefined {
  if (r.sp_lat === undefined || r.sp_lon === undefined) return undefined;
  return offsetFromSetPoint(r.lat, r.lon, r.sp_lat, r.sp_lon);
}

export const tableSpecs: { [S in Stream]: TableSpec<S> } = {
  station: {
    table: 'ts_station',
    columns: [
      'vessel_id', 't', 'dt', 'mode', 'dp_s',
      'n', 'sp_lat', 'sp_lon', 'sp_hdg',
      'err_north_mean', 'err_east_mean', 'err_r_mean',
      'err_r_rms', 'err_r_max', 'err_hist',
      'hdg_err_mean', 'hdg_err_rms', 'hdg_err_max_abs',
      'wind_ms', 'wind_gust_ms', 'wind_from_deg',
      'current_ms', 'current_to_deg', 'residual_kn',
      'residual_to_deg',
    ],
    lines: (vesselId, r) => {
      const { sp, err, hdg_err: h, env } = r;
      return (
        `${vesselId}\t${s(r.t)}\t${r.dt}\t${s(r.mode)}\t${r.dp_s}\t${r.n}\t${n(sp?.lat)}\t${n(sp?.lon)}\t${n(sp?.hdg)}\t` +
        `${n(err?.north_mean)}\t${n(err?.east_mean)}\t${n(err?.r_mean)}\t${n(err?.r_rms)}\t${n(err?.r_max)}\t${a(err?.hist)}\t` +
        `${n(h?.mean)}\t${n(h?.rms)}\t${n(h?.max_abs)}\t${n(env?.wind_ms)}\t${n(env?.wind_gust_ms)}\t${n(env?.wind_from_deg)}\t` +
        `${n(env?.current_ms)}\t${n(env?.current_to_deg)}\t${n(env?.residual_kn)}\t${n(env?.residual_to_deg)}\n`
      );
    },
  },
  thrusters: {
    table: 'ts_thruster',
    columns: [
      'vessel_id', 'unit_id', 't', 'dt', 'run_s',
      'starts', 'rpm', 'pitch_pct', 'load_pct_mean',
      'load_pct_max', 'thrust_kn', 'power_kw', 'azimuth_deg',
      'azimuth_travel_deg', 'load_band_s',
    ],
    // Plain loops for the per-unit streams, rather than a callback made for every record.
    lines: (vesselId, r) => {
      const common = `\t${s(r.t)}\t${r.dt}\t`;
      let out = '';
      for (const u of r.units) {
        out +=
          `${vesselId}\t${s(u.id)}${common}${u.run_s}\t${u.starts}\t${n(u.rpm)}\t${n(u.pitch_pct)}\t${n(u.load_pct_mean)}\t` +
          `${n(u.load_pct_max)}\t${n(u.thrust_kn)}\t${n(u.power_kw)}\t${n(u.azimuth_deg)}\t${n(u.azimuth_travel_deg)}\t${a(u.load_band_s)}\n`;
      }
      return out;
    },
  },
  power: {
    table: 'ts_power',
    columns: [
      'vessel_id', 'unit_id', 't', 'dt', 'kw_mean',
      'kw_max', 'kw_available', 'gens_online', 'limit_s',
      'limit_events', 'blackout',
    ],
    lines: (vesselId, r) => {
      const common = `\t${s(r.t)}\t${r.dt}\t`;
      let out = '';
      for (const x of r.buses) {
        out +=
          `${vesselId}\t${s(x.id)}${common}${n(x.kw_mean)}\t${n(x.kw_max)}\t${n(x.kw_available)}\t${n(x.gens_online)}\t` +
          `${n(x.limit_s)}\t${n(x.limit_events)}\t${b(x.blackout)}\n`;
      }
      return out;
    },
  },
  refs: {
    table: 'ts_ref',
    columns: [
      'vessel_id', 'unit_id', 't', 'dt', 'kind',
      'online_s', 'weight', 'sd_m', 'rejected',
    ],
    lines: (vesselId, r) => {
      const common = `\t${s(r.t)}\t${r.dt}\t`;
      let out = '';
      for (const x of r.systems) {
        out += `${vesselId}\t${s(x.id)}${common}${x.kind === undefined ? '\\N' : s(x.kind)}\t${n(x.online_s)}\t${n(x.weight)}\t${n(x.sd_m)}\t${n(x.rejected)}\n`;
      }
      return out;
    },
  },
  track: {
    table: 'ts_track',
    columns: [
      'vessel_id', 't', 'lat', 'lon', 'hdg',
      'sp_lat', 'sp_lon', 'sp_hdg', 'north_m',
      'east_m',
    ],
    lines: (vesselId, r) => {
      const offset = trackOffset(r);
      return `${vesselId}\t${s(r.t)}\t${r.lat}\t${r.lon}\t${n(r.hdg)}\t${n(r.sp_lat)}\t${n(r.sp_lon)}\t${n(r.sp_hdg)}\t${n(offset?.north)}\t${n(offset?.east)}\n`;
    },
  },
};
