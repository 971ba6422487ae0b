import type { PoolClient } from 'pg';
import type { DailyBusRow, DailyRefRow, DailyThrusterRow, DailyVesselRow } from './figures';

/**
 * Replace a batch's daily rows: delete every row of the batch's vessel-days,
 * then insert the new ones, so a unit that no longer has data that day (a
 * record deleted, a re-keyed thruster) leaves no stale row. Inserts go as one
 * statement per table through unnest of column arrays.
 */

const KEYS = 'unnest($1::int[], $2::date[]) AS k (vessel_id, day)';

export async function deleteDays(client: PoolClient, vesselIds: number[], days: string[]): Promise<void> {
  for (const table of ['daily_vessel', 'daily_thruster', 'daily_bus', 'daily_ref']) {
    await client.query(`DELETE FROM ${table} t USING ${KEYS} WHERE t.vessel_id = k.vessel_id AND t.day = k.day`, [vesselIds, days]);
  }
}

/** Column name → SQL array type of its parameter (and the cast of each element, where needed). */
type Columns<R> = readonly (readonly [keyof R & string, string, string?])[];

async function insertRows<R>(client: PoolClient, table: string, columns: Columns<R>, rows: readonly R[], render: Partial<Record<keyof R, (v: unknown) => unknown>> = {}): Promise<void> {
  if (rows.length === 0) return;
  const params = columns.map(([name]) => rows.map((r) => (render[name] ? render[name]!(r[name]) : r[name])));
  const names = columns.map(([name]) => name).join(', ');
  const sources = columns.map(([, type], i) => `$${i + 1}::${type}[]`).join(', ');
  const selects = columns.map(([name, , cast]) => (cast ? `${name}::${cast}` : name)).join(', ');
  await client.query(`INSERT INTO ${table} (${names}) SELECT ${selects} FROM unnest(${sources}) AS u (${names})`, params);
}

const VESSEL_COLUMNS: Columns<DailyVesselRow> = [
  ['vessel_id', 'int'],
  ['day', 'date'],
  ['station_records', 'int'],
  ['dp_intervals', 'int'],
  ['dp_hours', 'float8'],
  ['samples', 'int8'],
  ['err_hist', 'text', 'bigint[]'],
  ['p50_m', 'float8'],
  ['p95_m', 'float8'],
  ['p99_m', 'float8'],
  ['p95_overflow', 'bool'],
  ['r_rms_m', 'float8'],
  ['r_max_m', 'float8'],
  ['within_pct', 'text', 'jsonb'],
  ['hdg_rms_deg', 'float8'],
  ['hdg_max_abs_deg', 'float8'],
  ['wind_mean_ms', 'float8'],
  ['wind_beam_share', 'float8'],
  ['gust_max_ms', 'float8'],
  ['current_mean_ms', 'float8'],
  ['limit_events', 'int'],
  ['limit_seconds', 'float8'],
  ['limit_events_per_dp_day', 'float8'],
  ['blackouts', 'int'],
  ['peak_load_ratio', 'float8'],
];

const THRUSTER_COLUMNS: Columns<DailyThrusterRow> = [
  ['vessel_id', 'int'],
  ['unit_id', 'text'],
  ['day', 'date'],
  ['run_hours', 'float8'],
  ['starts', 'int'],
  ['azimuth_travel_deg', 'float8'],
  ['wear_hours', 'float8'],
  ['unbanded_run_s', 'float8'],
  ['efficiency_index', 'float8'],
];

const BUS_COLUMNS: Columns<DailyBusRow> = [
  ['vessel_id', 'int'],
  ['unit_id', 'text'],
  ['day', 'date'],
  ['limit_events', 'int'],
  ['limit_seconds', 'float8'],
  ['blackouts', 'int'],
  ['peak_load_ratio', 'float8'],
];

const REF_COLUMNS: Columns<DailyRefRow> = [
  ['vessel_id', 'int'],
  ['unit_id', 'text'],
  ['day', 'date'],
  ['kind', 'text'],
  ['online_hours', 'float8'],
  ['weight_mean', 'float8'],
  ['sd_m_median', 'float8'],
  ['rejections', 'int'],
];

export async function insertDailyRows(
  client: PoolClient,
  rows: { vessel: DailyVesselRow[]; thruster: DailyThrusterRow[]; bus: DailyBusRow[]; ref: DailyRefRow[] },
): Promise<void> {
  await insertRows(client, 'daily_vessel', VESSEL_COLUMNS, rows.vessel, {
    err_hist: (h) => (h === null ? null : `{${(h as number[]).join(',')}}`),
    within_pct: (w) => JSON.stringify(w),
  });
  await insertRows(client, 'daily_thruster', THRUSTER_COLUMNS, rows.thruster);
  await insertRows(client, 'daily_bus', BUS_COLUMNS, rows.bus);
  await insertRows(client, 'daily_ref', REF_COLUMNS, rows.ref);
}

/** Set p95_norm of the given vessel-days, touching only rows whose value changes. */
export async function updateP95Norm(client: PoolClient, updates: { vessel_id: number; day: string; p95_norm: number | null }[]): Promise<void> {
  if (updates.length === 0) return;
  await client.query(
    `UPDATE daily_vessel t SET p95_norm = u.p95_norm
       FROM unnest($1::int[], $2::date[], $3::float8[]) AS u (vessel_id, day, p95_norm)
      WHERE t.vessel_id = u.vessel_id AND t.day = u.day AND t.p95_norm IS DISTINCT FROM u.p95_norm`,
    [updates.map((u) => u.vessel_id), updates.map((u) => u.day), updates.map((u) => u.p95_norm)],
  );
}
