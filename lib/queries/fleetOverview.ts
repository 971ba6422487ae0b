import type { Pool } from '../db/pool';

/**
 * Fleet overview: one row per registered vessel, for the Fleet page.
 *
 * Assumptions
 * - Records are contract records: one per vessel, stream and interval start
 *   `t`. The per-unit streams (thrusters, power, refs) store one row per unit
 *   per interval, so their records are the DISTINCT `t` across units.
 * - Window: the 24 hours ending at `now`, `now - 24 h < t <= now`, on the
 *   interval start `t` (UTC instants; no fleet-day boundaries involved).
 *   `now` defaults to the web server's clock.
 * - `lastRecordAt` is the latest `t <= now` over all five streams, at any age
 *   (not limited to the window); null when the vessel never reported. Rows
 *   stamped after `now` (a vessel clock running ahead) are ignored by both
 *   figures, so a query for a given `now` always gives the same answer.
 * - Vessels come from the register (`vessel`); telemetry of vessel ids not in
 *   the register is not shown.
 *
 * Cost: every figure is read through the primary keys, (vessel_id, t) or
 * (vessel_id, unit_id, t). For per-unit streams the units are first found
 * with a loose index scan (one index probe per unit, fleet-wide), so both the
 * 24 h counts and the latest `t` touch only the rows in the window plus one
 * index entry per unit, however long the history is.
 */

export interface StreamCounts {
  station: number;
  thrusters: number;
  power: number;
  refs: number;
  track: number;
}

export interface FleetOverviewRow {
  key: string;
  name: string;
  type: string;
  dpClass: number;
  lastRecordAt: Date | null;
  records24h: StreamCounts;
}

const WINDOW_MS = 24 * 60 * 60 * 1000;

type Queryable = Pick<Pool, 'query'>;

// The SQL is assembled once, from the literal stream and table names below
// only; every value is bound: $1 = now, $2 = now - 24 h.
const IN_WINDOW = 'x.t > $2 AND x.t <= $1';

type PerUnitTable = 'ts_thruster' | 'ts_power' | 'ts_ref';
type PerVesselTable = 'ts_station' | 'ts_track';

/**
 * `<stream>_units`: the (vessel, unit) pairs present in the table, found by a
 * loose index scan; `<stream>_last`: latest t per vessel; `<stream>_records`:
 * distinct t per vessel in the window.
 */
function perUnitCtes(stream: string, table: PerUnitTable): string {
  return `  ${stream}_units AS (
    (SELECT vessel_id, unit_id FROM ${table} ORDER BY vessel_id, unit_id LIMIT 1)
    UNION ALL
    SELECT n.vessel_id, n.unit_id
      FROM ${stream}_units p
      CROSS JOIN LATERAL (
        SELECT x.vessel_id, x.unit_id FROM ${table} x
         WHERE (x.vessel_id, x.unit_id) > (p.vessel_id, p.unit_id)
         ORDER BY x.vessel_id, x.unit_id LIMIT 1) n
  ),
  ${stream}_last AS (
    SELECT u.vessel_id, max(l.t) AS last_t
      FROM ${stream}_units u
      CROSS JOIN LATERAL (
        SELECT max(x.t) AS t FROM ${table} x
         WHERE x.vessel_id = u.vessel_id AND x.unit_id = u.unit_id AND x.t <= $1) l
     GROUP BY u.vessel_id
  ),
  ${stream}_records AS (
    SELECT u.vessel_id, count(DISTINCT w.t)::int AS records
      FROM ${stream}_units u
      CROSS JOIN LATERAL (
        SELECT x.t FROM ${table} x
         WHERE x.vessel_id = u.vessel_id AND x.unit_id = u.unit_id AND ${IN_WINDOW}) w
     GROUP BY u.vessel_id
  )`;
}

/** `<stream>` (records in the window) and `<stream>_last`, read on (vessel_id, t). */
function perVesselColumns(stream: string, table: PerVesselTable): string {
  return `           (SELECT count(*)::int FROM ${table} x WHERE x.vessel_id = v.id AND ${IN_WINDOW}) AS ${stream},
           (SELECT max(x.t) FROM ${table} x WHERE x.vessel_id = v.id AND x.t <= $1) AS ${stream}_last`;
}

const SQL = `
WITH RECURSIVE
${perUnitCtes('thrusters', 'ts_thruster')},
${perUnitCtes('power', 'ts_power')},
${perUnitCtes('refs', 'ts_ref')}
SELECT v.key, v.name, v.type, v.dp_class,
       v.station,
       coalesce(thrusters_records.records, 0) AS thrusters,
       coalesce(power_records.records, 0) AS power,
       coalesce(refs_records.records, 0) AS refs,
       v.track,
       GREATEST(v.station_last, thrusters_last.last_t, power_last.last_t, refs_last.last_t, v.track_last)
         AS last_record_at
  FROM (
    SELECT v.id, v.key, v.name, v.type, v.dp_class,
${perVesselColumns('station', 'ts_station')},
${perVesselColumns('track', 'ts_track')}
      FROM vessel v
  ) v
  LEFT JOIN thrusters_records ON thrusters_records.vessel_id = v.id
  LEFT JOIN thrusters_last ON thrusters_last.vessel_id = v.id
  LEFT JOIN power_records ON power_records.vessel_id = v.id
  LEFT JOIN power_last ON power_last.vessel_id = v.id
  LEFT JOIN refs_records ON refs_records.vessel_id = v.id
  LEFT JOIN refs_last ON refs_last.vessel_id = v.id
 ORDER BY v.name, v.key`;

interface Raw {
  key: string;
  name: string;
  type: string;
  dp_class: number;
  station: number;
  thrusters: number;
  power: number;
  refs: number;
  track: number;
  last_record_at: Date | null;
}

/** Every registered vessel, by name, with its latest record and 24 h record counts. */
export async function getFleetOverview(pool: Queryable, now: Date = new Date()): Promise<FleetOverviewRow[]> {
  const since = new Date(now.getTime() - WINDOW_MS);
  const { rows } = await pool.query<Raw>(SQL, [now, since]);
  return rows.map((r) => ({
    key: r.key,
    name: r.name,
    type: r.type,
    dpClass: Number(r.dp_class),
    lastRecordAt: r.last_record_at,
    records24h: {
      station: r.station,
      thrusters: r.thrusters,
      power: r.power,
      refs: r.refs,
      track: r.track,
    },
  }));
}
