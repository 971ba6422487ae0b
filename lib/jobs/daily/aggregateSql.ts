/**
 * Set-oriented SQL that reduces one batch of vessel-days to the sums the
 * metrics-v1 formulas need, one row per vessel-day (or per unit and day).
 * The formulas themselves stay in lib/metrics: these queries only add up
 * interval values with exactly the skip rules of those functions (a field an
 * interval did not send is skipped, never read as 0), and figures.ts
 * finishes each figure with them. test/dailyMetrics.test.ts proves the two
 * agree on randomised records.
 *
 * Why SQL sums and not rows shipped to Node: a vessel-day is ~1,440 station,
 * ~11,500 thruster, ~2,900 power and ~4,300 refs rows; summing in the
 * database moves a few hundred bytes per vessel-day instead of megabytes.
 * The station histograms are the exception: PostgreSQL has no element-wise
 * array sum, and unnest + GROUP BY costs ~10 µs per interval, so the DP
 * intervals' `err.hist` arrays come back as one text per vessel-day (bins
 * separated by ',', intervals by ';') and histogramText.ts adds them up.
 *
 * Parameters of every query: ranges of consecutive fleet days per vessel —
 * $1 vessel ids (int[]), $2 first days, $3 last days (date[], inclusive),
 * zipped — and $4 the fleet IANA time zone. A range runs from the local
 * midnight starting its first day to the one ending its last
 * (`day::timestamp AT TIME ZONE tz`), and each row is grouped by its local
 * day (`t AT TIME ZONE tz`), so a 23- or 25-hour DST day is right. Ranges
 * rather than single days: a row is matched to its range once, instead of
 * being compared with every requested day of its vessel. float4 columns are
 * widened before arithmetic.
 */

const BATCH = `
  WITH d AS (
    SELECT vessel_id,
           (first_day::timestamp AT TIME ZONE $4) AS t0,
           ((last_day + 1)::timestamp AT TIME ZONE $4) AS t1
      FROM unnest($1::int[], $2::date[], $3::date[]) AS u (vessel_id, first_day, last_day))`;

/** The rows of each range, each with the fleet day it belongs to. */
const dayJoin = (table: string, extra = '') => `
    FROM d
    JOIN LATERAL (SELECT x.*, (x.t AT TIME ZONE $4)::date AS day${extra} FROM ${table} x
                   WHERE x.vessel_id = d.vessel_id AND x.t >= d.t0 AND x.t < d.t1) s ON true`;

/** Station: dp_hours over every interval; the rest over DP intervals (mode auto_position). */
export const STATION_SQL = `${BATCH}
  SELECT d.vessel_id, s.day::text AS day,
         count(*)::int AS station_records,
         count(*) FILTER (WHERE s.dp)::int AS dp_intervals,
         sum(s.dp_s::float8) / 3600 AS dp_hours,
         string_agg(array_to_string(s.err_hist, ','), ';') FILTER (WHERE s.dp AND s.err_hist IS NOT NULL) AS hist_text,
         sum(s.n::float8 * s.err_r_rms::float8 * s.err_r_rms::float8) FILTER (WHERE s.dp AND s.err_r_rms IS NOT NULL AND s.n > 0) AS r_ss,
         sum(s.n::float8) FILTER (WHERE s.dp AND s.err_r_rms IS NOT NULL AND s.n > 0) AS r_n,
         max(s.err_r_max::float8) FILTER (WHERE s.dp) AS r_max,
         sum(s.n::float8 * s.hdg_err_rms::float8 * s.hdg_err_rms::float8) FILTER (WHERE s.dp AND s.hdg_err_rms IS NOT NULL AND s.n > 0) AS h_ss,
         sum(s.n::float8) FILTER (WHERE s.dp AND s.hdg_err_rms IS NOT NULL AND s.n > 0) AS h_n,
         max(s.hdg_err_max_abs::float8) FILTER (WHERE s.dp) AS h_max_abs,
         sum(s.dt::float8 * s.wind_ms::float8) FILTER (WHERE s.dp AND s.wind_ms IS NOT NULL) AS wind_sum,
         sum(s.dt::float8) FILTER (WHERE s.dp AND s.wind_ms IS NOT NULL) AS wind_dt,
         sum(s.dt::float8 * abs(sin(radians(s.wind_from_deg::float8 - s.sp_hdg::float8)))) FILTER (WHERE s.dp AND s.beam) AS beam_sum,
         sum(s.dt::float8) FILTER (WHERE s.dp AND s.beam) AS beam_dt,
         sum(s.dt::float8 * s.current_ms::float8) FILTER (WHERE s.dp AND s.current_ms IS NOT NULL) AS current_sum,
         sum(s.dt::float8) FILTER (WHERE s.dp AND s.current_ms IS NOT NULL) AS current_dt,
         max(s.wind_gust_ms::float8) FILTER (WHERE s.dp) AS gust_max
  ${dayJoin('ts_station', ", x.mode = 'auto_position' AS dp, (x.wind_from_deg IS NOT NULL AND x.sp_hdg IS NOT NULL AND x.wind_ms > 0) AS beam")}
   GROUP BY d.vessel_id, s.day`;

/** Thrusters, per unit: running, starts, travel, load-band seconds and the efficiency sums. */
export const THRUSTER_SQL = `${BATCH}
  SELECT d.vessel_id, s.day::text AS day, s.unit_id,
         sum(s.run_s::float8) / 3600 AS run_hours,
         sum(s.starts)::int AS starts,
         sum(s.azimuth_travel_deg::float8) AS azimuth_travel_deg,
         count(*) FILTER (WHERE s.load_band_s IS NOT NULL OR NOT s.run_s > 0)::int AS wear_known,
         coalesce(sum(s.run_s::float8) FILTER (WHERE s.load_band_s IS NULL AND s.run_s > 0), 0) AS unbanded_run_s,
         ARRAY[${Array.from({ length: 11 }, (_, b) => `coalesce(sum(s.load_band_s[${b + 1}]::float8), 0)`).join(', ')}] AS band_s,
         sum(s.thrust_kn::float8 * s.run_s::float8) FILTER (WHERE s.eff) AS eff_num,
         sum(s.power_kw::float8 ^ (2.0 / 3) * s.run_s::float8) FILTER (WHERE s.eff) AS eff_den,
         count(*) FILTER (WHERE s.eff)::int AS eff_n
  ${dayJoin('ts_thruster', ', (x.run_s > 0 AND x.power_kw > 0 AND x.thrust_kn IS NOT NULL) AS eff')}
   GROUP BY d.vessel_id, s.day, s.unit_id`;

/** Power, per bus: every interval, whatever the DP mode. */
export const BUS_SQL = `${BATCH}
  SELECT d.vessel_id, s.day::text AS day, s.unit_id,
         sum(s.limit_events)::int AS limit_events,
         sum(s.limit_s::float8) AS limit_seconds,
         count(*) FILTER (WHERE s.blackout)::int AS blackouts,
         max(s.kw_max::float8 / s.kw_available::float8) FILTER (WHERE s.kw_available > 0 AND s.kw_max IS NOT NULL) AS peak_load_ratio
  ${dayJoin('ts_power')}
   GROUP BY d.vessel_id, s.day, s.unit_id`;

/**
 * Reference systems, per system. The median is percentile_cont over each
 * system-day's values gathered by array_agg, not an ordered-set aggregate of
 * the query itself: an ordered-set aggregate forces the whole batch's rows
 * to be sorted by vessel, day and system before grouping, which cost more
 * than the rest of the query; this way the grouping is hashed and only each
 * system-day's ~1,440 values are sorted. Same values, same percentile_cont,
 * same result.
 */
export const REF_SQL = `${BATCH}
  SELECT d.vessel_id, s.day::text AS day, s.unit_id,
         max(s.kind) AS kind,
         sum(s.online_s::float8) / 3600 AS online_hours,
         sum(s.online_s::float8 * s.weight::float8) FILTER (WHERE s.online_s IS NOT NULL AND s.weight IS NOT NULL) AS weight_sum,
         sum(s.online_s::float8) FILTER (WHERE s.online_s IS NOT NULL AND s.weight IS NOT NULL) AS weight_online_s,
         (SELECT percentile_cont(0.5) WITHIN GROUP (ORDER BY v)
            FROM unnest(array_agg(s.sd_m::float8) FILTER (WHERE s.online_s > 0 AND s.sd_m IS NOT NULL)) AS v) AS sd_m_median,
         sum(s.rejected)::int AS rejections
  ${dayJoin('ts_ref')}
   GROUP BY d.vessel_id, s.day, s.unit_id`;

/** What the figures need from the register: watch circles and life exponents. */
export const REGISTER_SQL = `
  SELECT v.id AS vessel_id, v.watch_circles_m,
         coalesce(json_object_agg(t.unit_id, t.life_exponent) FILTER (WHERE t.unit_id IS NOT NULL), '{}') AS life_exponents
    FROM vessel v LEFT JOIN thruster t ON t.vessel_id = v.id
   WHERE v.id = ANY($1::int[])
   GROUP BY v.id`;

export interface StationAggregate {
  vessel_id: number;
  day: string;
  station_records: number;
  dp_intervals: number;
  dp_hours: number;
  hist_text: string | null;
  r_ss: number | null;
  r_n: number | null;
  r_max: number | null;
  h_ss: number | null;
  h_n: number | null;
  h_max_abs: number | null;
  wind_sum: number | null;
  wind_dt: number | null;
  beam_sum: number | null;
  beam_dt: number | null;
  current_sum: number | null;
  current_dt: number | null;
  gust_max: number | null;
}

export interface ThrusterAggregate {
  vessel_id: number;
  day: string;
  unit_id: string;
  run_hours: number;
  starts: number;
  azimuth_travel_deg: number | null;
  wear_known: number;
  unbanded_run_s: number;
  band_s: number[];
  eff_num: number | null;
  eff_den: number | null;
  eff_n: number;
}

export interface BusAggregate {
  vessel_id: number;
  day: string;
  unit_id: string;
  limit_events: number | null;
  limit_seconds: number | null;
  blackouts: number;
  peak_load_ratio: number | null;
}

export interface RefAggregate {
  vessel_id: number;
  day: string;
  unit_id: string;
  kind: string | null;
  online_hours: number | null;
  weight_sum: number | null;
  weight_online_s: number | null;
  sd_m_median: number | null;
  rejections: number | null;
}

export interface RegisterEntry {
  vessel_id: number;
  watch_circles_m: number[];
  life_exponents: Record<string, number>;
}
