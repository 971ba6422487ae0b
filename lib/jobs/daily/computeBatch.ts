import type { PoolClient } from 'pg';
import {
  BUS_SQL,
  REF_SQL,
  REGISTER_SQL,
  STATION_SQL,
  THRUSTER_SQL,
  type BusAggregate,
  type RefAggregate,
  type RegisterEntry,
  type StationAggregate,
  type ThrusterAggregate,
} from './aggregateSql';
import { dayRanges } from './dayRanges';
import { refDayRow, thrusterDayRow, vesselDayRow, type DailyVesselRow } from './figures';
import { affectedRange, normalisedDays, type StoredDay } from './normalisation';
import { deleteDays, insertDailyRows, updateP95Norm } from './writeRows';

export interface VesselDay {
  vesselId: number;
  day: string;
}

/** Advisory-lock namespace of the daily job (first key of pg_advisory_xact_lock(int, int)). */
export const DAILY_LOCK_NAMESPACE = 0x486f6c64; // "Hold"

/**
 * Transaction-local settings for the few large aggregates of a batch (the
 * statements after them are small keyed lookups, which these suit as well):
 * - each day range is read through its own bitmap scan of the primary key
 *   (nested loop over the ranges, no hash or merge join, no plain index
 *   scan): only the batch's rows are read, in heap order, and run-time
 *   partition pruning skips the months outside the range. Left to itself the
 *   planner hash-joins the ranges with a sequential scan of every partition
 *   once a batch covers a fair share of a table, reading every vessel's rows
 *   for each batch (bench:jobs: 5× the rows read); a plain index scan visits
 *   the heap in key order, page after page again (twice the CPU of a bitmap
 *   scan on ts_thruster);
 * - grouping by hashing rather than sorting: the planner underestimates the
 *   rows per range and sorts hundreds of thousands of wide rows by vessel,
 *   day and unit (a third of the station and reference queries' CPU);
 * - no parallel workers: recomputeDays already runs batches side by side,
 *   and extra workers only add start-up and contention;
 * - JIT compilation costs more than it saves on these statements;
 * - the reference median sorts in memory.
 */
const AGGREGATE_SETTINGS_SQL = `
  SELECT set_config('enable_hashjoin', 'off', true), set_config('enable_mergejoin', 'off', true),
         set_config('enable_indexscan', 'off', true), set_config('enable_sort', 'off', true),
         set_config('max_parallel_workers_per_gather', '0', true),
         set_config('jit', 'off', true), set_config('work_mem', '64MB', true)`;

const keyOf = (vesselId: number, day: string) => `${vesselId}/${day}`;

function groupBy<T extends { vessel_id: number; day: string }>(rows: readonly T[]): Map<string, T[]> {
  const m = new Map<string, T[]>();
  for (const r of rows) {
    const k = keyOf(r.vessel_id, r.day);
    const list = m.get(k);
    if (list) list.push(r);
    else m.set(k, [r]);
  }
  return m;
}

/**
 * Recompute the daily rows of a batch of vessel-days inside the caller's
 * transaction, then the p95_norm of every day whose baseline they touch.
 *
 * Each vessel of the batch is locked first (transaction-scoped advisory
 * locks, taken in vessel order so two batches cannot deadlock): two job
 * processes never compute the same vessel at once, and the p95_norm pass
 * reads a vessel's days while nobody else rewrites them.
 */
export async function computeBatch(client: PoolClient, batch: readonly VesselDay[], timeZone: string): Promise<void> {
  const unique = new Map(batch.map((b) => [keyOf(b.vesselId, b.day), b]));
  const work = [...unique.values()];
  if (work.length === 0) return;
  const vesselIds = work.map((w) => w.vesselId);
  const days = work.map((w) => w.day);
  const distinctVessels = [...new Set(vesselIds)].sort((a, b) => a - b);
  await client.query('SELECT pg_advisory_xact_lock($1, v) FROM unnest($2::int[]) AS v ORDER BY v', [DAILY_LOCK_NAMESPACE, distinctVessels]);

  await client.query(AGGREGATE_SETTINGS_SQL);
  const ranges = dayRanges(work);
  const params = [ranges.map((r) => r.vesselId), ranges.map((r) => r.from), ranges.map((r) => r.to), timeZone];
  const station = await client.query<StationAggregate>(STATION_SQL, params);
  const thrusters = await client.query<ThrusterAggregate>(THRUSTER_SQL, params);
  const buses = await client.query<BusAggregate>(BUS_SQL, params);
  const refs = await client.query<RefAggregate>(REF_SQL, params);
  const register = await client.query<RegisterEntry>(REGISTER_SQL, [distinctVessels]);
  const registerOf = new Map(register.rows.map((r) => [r.vessel_id, r]));

  const stationOf = new Map(station.rows.map((r) => [keyOf(r.vessel_id, r.day), r]));
  const busesOf = groupBy(buses.rows);
  const thrustersOf = groupBy(thrusters.rows);
  const refsOf = groupBy(refs.rows);

  const vesselRows: DailyVesselRow[] = [];
  for (const w of work) {
    const k = keyOf(w.vesselId, w.day);
    const s = stationOf.get(k);
    const b = busesOf.get(k) ?? [];
    // A vessel-day that received no telemetry at all has no row (a gap, not zeros).
    if (!s && b.length === 0 && !thrustersOf.has(k) && !refsOf.has(k)) continue;
    vesselRows.push(vesselDayRow({ vessel_id: w.vesselId, day: w.day }, s, b, registerOf.get(w.vesselId)?.watch_circles_m ?? []));
  }
  const thrusterRows = thrusters.rows.map((a) => thrusterDayRow(a, registerOf.get(a.vessel_id)?.life_exponents[a.unit_id]));

  await deleteDays(client, vesselIds, days);
  await insertDailyRows(client, { vessel: vesselRows, thruster: thrusterRows, bus: buses.rows, ref: refs.rows.map(refDayRow) });
  await renormalise(client, work);
}

/** Re-evaluate p95_norm for each vessel's changed days and the days whose baselines hold them. */
async function renormalise(client: PoolClient, work: readonly VesselDay[]): Promise<void> {
  const ranges = new Map<number, { from: string; to: string }>();
  for (const w of work) {
    const r = ranges.get(w.vesselId);
    if (!r) ranges.set(w.vesselId, { from: w.day, to: w.day });
    else {
      if (w.day < r.from) r.from = w.day;
      if (w.day > r.to) r.to = w.day;
    }
  }
  const affected = new Map([...ranges].map(([v, r]) => [v, affectedRange(r.from, r.to)]));
  const readFrom = [...affected.values()].reduce((m, a) => (a.readFrom < m ? a.readFrom : m), '9999-12-31');
  const readTo = [...affected.values()].reduce((m, a) => (a.evaluateTo > m ? a.evaluateTo : m), '0000-01-01');
  const { rows } = await client.query<StoredDay & { vessel_id: number }>(
    `SELECT vessel_id, day::text AS day, p95_m, p95_overflow, wind_mean_ms, current_mean_ms
       FROM daily_vessel
      WHERE vessel_id = ANY($1::int[]) AND day BETWEEN $2 AND $3
      ORDER BY vessel_id, day`,
    [[...affected.keys()], readFrom, readTo],
  );
  const byVessel = new Map<number, StoredDay[]>();
  for (const r of rows) {
    const list = byVessel.get(r.vessel_id);
    if (list) list.push(r);
    else byVessel.set(r.vessel_id, [r]);
  }
  const updates: { vessel_id: number; day: string; p95_norm: number | null }[] = [];
  for (const [vesselId, a] of affected) {
    const norms = normalisedDays(byVessel.get(vesselId) ?? [], a.evaluateFrom, a.evaluateTo);
    for (const [day, p95_norm] of norms) updates.push({ vessel_id: vesselId, day, p95_norm });
  }
  await updateP95Norm(client, updates);
}
