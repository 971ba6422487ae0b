import { offsetFromSetPoint } from '../geo/wgs84';
import type { Stream, TelemetryRecord, TrackRecord } from './schemas';

/**
 * How each stream's records become rows of its time-series table. Column
 * lists carry the PostgreSQL array type used to bind a whole batch as one
 * parameter per column (INSERT … SELECT FROM unnest(...)).
 */
export interface TableSpec<S extends Stream> {
  table: string;
  columns: readonly (readonly [name: string, pgArrayType: string])[];
  /** The rows of one record, values in `columns` order (vessel_id first). */
  rows(vesselId: number, record: TelemetryRecord[S]): unknown[][];
}

const nil = <T>(v: T | undefined): T | null => (v === undefined ? null : v);

/** Offsets from the set point, when the record names one (docs/telemetry.md). */
function trackOffset(r: TrackRecord): { north: number; east: number } | undefined {
  if (r.sp_lat === undefined || r.sp_lon === undefined) return undefined;
  return offsetFromSetPoint(r.lat, r.lon, r.sp_lat, r.sp_lon);
}

/** A nested array column travels as a JSON text so unnest keeps it whole. */
const arrayAsJson = (v: readonly number[] | undefined) => (v === undefined ? null : JSON.stringify(v));

export const tableSpecs: { [S in Stream]: TableSpec<S> } = {
  station: {
    table: 'ts_station',
    columns: [
      ['vessel_id', 'int4[]'], ['t', 'timestamptz[]'], ['dt', 'int2[]'], ['mode', 'text[]'], ['dp_s', 'float4[]'],
      ['n', 'int4[]'], ['sp_lat', 'float8[]'], ['sp_lon', 'float8[]'], ['sp_hdg', 'float4[]'],
      ['err_north_mean', 'float4[]'], ['err_east_mean', 'float4[]'], ['err_r_mean', 'float4[]'],
      ['err_r_rms', 'float4[]'], ['err_r_max', 'float4[]'], ['err_hist', 'json:int4[]'],
      ['hdg_err_mean', 'float4[]'], ['hdg_err_rms', 'float4[]'], ['hdg_err_max_abs', 'float4[]'],
      ['wind_ms', 'float4[]'], ['wind_gust_ms', 'float4[]'], ['wind_from_deg', 'float4[]'],
      ['current_ms', 'float4[]'], ['current_to_deg', 'float4[]'], ['residual_kn', 'float4[]'],
      ['residual_to_deg', 'float4[]'],
    ],
    rows: (vesselId, r) => [
      [
        vesselId, r.t, r.dt, r.mode, r.dp_s, r.n, nil(r.sp?.lat), nil(r.sp?.lon), nil(r.sp?.hdg),
        nil(r.err?.north_mean), nil(r.err?.east_mean), nil(r.err?.r_mean), nil(r.err?.r_rms), nil(r.err?.r_max),
        arrayAsJson(r.err?.hist), nil(r.hdg_err?.mean), nil(r.hdg_err?.rms), nil(r.hdg_err?.max_abs),
        nil(r.env?.wind_ms), nil(r.env?.wind_gust_ms), nil(r.env?.wind_from_deg), nil(r.env?.current_ms),
        nil(r.env?.current_to_deg), nil(r.env?.residual_kn), nil(r.env?.residual_to_deg),
      ],
    ],
  },
  thrusters: {
    table: 'ts_thruster',
    columns: [
      ['vessel_id', 'int4[]'], ['unit_id', 'text[]'], ['t', 'timestamptz[]'], ['dt', 'int2[]'], ['run_s', 'float4[]'],
      ['starts', 'int4[]'], ['rpm', 'float4[]'], ['pitch_pct', 'float4[]'], ['load_pct_mean', 'float4[]'],
      ['load_pct_max', 'float4[]'], ['thrust_kn', 'float4[]'], ['power_kw', 'float4[]'], ['azimuth_deg', 'float4[]'],
      ['azimuth_travel_deg', 'float4[]'], ['load_band_s', 'json:float4[]'],
    ],
    rows: (vesselId, r) =>
      r.units.map((u) => [
        vesselId, u.id, r.t, r.dt, u.run_s, u.starts, nil(u.rpm), nil(u.pitch_pct), nil(u.load_pct_mean),
        nil(u.load_pct_max), nil(u.thrust_kn), nil(u.power_kw), nil(u.azimuth_deg), nil(u.azimuth_travel_deg),
        arrayAsJson(u.load_band_s),
      ]),
  },
  power: {
    table: 'ts_power',
    columns: [
      ['vessel_id', 'int4[]'], ['unit_id', 'text[]'], ['t', 'timestamptz[]'], ['dt', 'int2[]'], ['kw_mean', 'float4[]'],
      ['kw_max', 'float4[]'], ['kw_available', 'float4[]'], ['gens_online', 'int4[]'], ['limit_s', 'float4[]'],
      ['limit_events', 'int4[]'], ['blackout', 'bool[]'],
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
      ['vessel_id', 'int4[]'], ['unit_id', 'text[]'], ['t', 'timestamptz[]'], ['dt', 'int2[]'], ['kind', 'text[]'],
      ['online_s', 'float4[]'], ['weight', 'float4[]'], ['sd_m', 'float4[]'], ['rejected', 'int4[]'],
    ],
    rows: (vesselId, r) =>
      r.systems.map((s) => [
        vesselId, s.id, r.t, r.dt, nil(s.kind), nil(s.online_s), nil(s.weight), nil(s.sd_m), nil(s.rejected),
      ]),
  },
  track: {
    table: 'ts_track',
    columns: [
      ['vessel_id', 'int4[]'], ['t', 'timestamptz[]'], ['lat', 'float8[]'], ['lon', 'float8[]'], ['hdg', 'float4[]'],
      ['sp_lat', 'float8[]'], ['sp_lon', 'float8[]'], ['sp_hdg', 'float4[]'], ['north_m', 'float4[]'],
      ['east_m', 'float4[]'],
    ],
    rows: (vesselId, r) => {
      const offset = trackOffset(r);
      return [
        [vesselId, r.t, r.lat, r.lon, nil(r.hdg), nil(r.sp_lat), nil(r.sp_lon), nil(r.sp_hdg), nil(offset?.north), nil(offset?.east)],
      ];
    },
  },
};
