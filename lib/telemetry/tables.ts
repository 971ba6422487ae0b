import { offsetFromSetPoint } from '../geo/wgs84';
import type { Stream, TelemetryRecord, TrackRecord } from './schemas';

/**
 * How each stream's records become rows of its time-series table, in the
 * table's column order: values ready for COPY (array columns as PostgreSQL
 * array literals such as {1,2,3}).
 */
export interface TableSpec<S extends Stream> {
  table: string;
  columns: readonly string[];
  /** The rows of one record, values in `columns` order (vessel_id first). */
  rows(vesselId: number, record: TelemetryRecord[S]): unknown[][];
}

const nil = <T>(v: T | undefined): T | null => (v === undefined ? null : v);

/** Offsets from the set point, when the record names one (docs/telemetry.md). */
function trackOffset(r: TrackRecord): { north: number; east: number } | undefined {
  if (r.sp_lat === undefined || r.sp_lon === undefined) return undefined;
  return offsetFromSetPoint(r.lat, r.lon, r.sp_lat, r.sp_lon);
}

/** A PostgreSQL array literal, {1,2,3}. */
const pgArray = (v: readonly number[] | undefined) => (v === undefined ? null : `{${v.join(',')}}`);

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
    rows: (vesselId, r) => [
      [
        vesselId, r.t, r.dt, r.mode, r.dp_s, r.n, nil(r.sp?.lat), nil(r.sp?.lon), nil(r.sp?.hdg),
        nil(r.err?.north_mean), nil(r.err?.east_mean), nil(r.err?.r_mean), nil(r.err?.r_rms), nil(r.err?.r_max),
        pgArray(r.err?.hist), nil(r.hdg_err?.mean), nil(r.hdg_err?.rms), nil(r.hdg_err?.max_abs),
        nil(r.env?.wind_ms), nil(r.env?.wind_gust_ms), nil(r.env?.wind_from_deg), nil(r.env?.current_ms),
        nil(r.env?.current_to_deg), nil(r.env?.residual_kn), nil(r.env?.residual_to_deg),
      ],
    ],
  },
  thrusters: {
    table: 'ts_thruster',
    columns: [
      'vessel_id', 'unit_id', 't', 'dt', 'run_s',
      'starts', 'rpm', 'pitch_pct', 'load_pct_mean',
      'load_pct_max', 'thrust_kn', 'power_kw', 'azimuth_deg',
      'azimuth_travel_deg', 'load_band_s',
    ],
    rows: (vesselId, r) =>
      r.units.map((u) => [
        vesselId, u.id, r.t, r.dt, u.run_s, u.starts, nil(u.rpm), nil(u.pitch_pct), nil(u.load_pct_mean),
        nil(u.load_pct_max), nil(u.thrust_kn), nil(u.power_kw), nil(u.azimuth_deg), nil(u.azimuth_travel_deg),
        pgArray(u.load_band_s),
      ]),
  },
  power: {
    table: 'ts_power',
    columns: [
      'vessel_id', 'unit_id', 't', 'dt', 'kw_mean',
      'kw_max', 'kw_available', 'gens_online', 'limit_s',
      'limit_events', 'blackout',
    ],
    rows: (vesselId, r) =>
      r.buses.map((b) => [
        vesselId, b.id, r.t, r.dt, nil(b.kw_mean), nil(b.kw_max), nil(b.kw_available), nil(b.gens_online),
        nil(b.limit_s), nil(b.limit_events), nil(b.blackout),
      ]),
  },
  refs: {
    table: 'ts_ref',
    columns: [
      'vessel_id', 'unit_id', 't', 'dt', 'kind',
      'online_s', 'weight', 'sd_m', 'rejected',
    ],
    rows: (vesselId, r) =>
      r.systems.map((s) => [
        vesselId, s.id, r.t, r.dt, nil(s.kind), nil(s.online_s), nil(s.weight), nil(s.sd_m), nil(s.rejected),
      ]),
  },
  track: {
    table: 'ts_track',
    columns: [
      'vessel_id', 't', 'lat', 'lon', 'hdg',
      'sp_lat', 'sp_lon', 'sp_hdg', 'north_m',
      'east_m',
    ],
    rows: (vesselId, r) => {
      const offset = trackOffset(r);
      return [
        [vesselId, r.t, r.lat, r.lon, nil(r.hdg), nil(r.sp_lat), nil(r.sp_lon), nil(r.sp_hdg), nil(offset?.north), nil(offset?.east)],
      ];
    },
  },
};
