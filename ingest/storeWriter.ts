import type { PoolClient } from 'pg';
import type { Stream, TelemetryRecord } from '../lib/telemetry/schemas';
import { tableSpecs } from '../lib/telemetry/tables';

export interface RecordBatch<S extends Stream = Stream> {
  stream: S;
  vesselId: number;
  records: TelemetryRecord[S][];
}

export interface WriteResult {
  /** Rows stored (one per unit for per-unit streams). */
  inserted: number;
  /** Rows whose key was already stored: the first copy wins. */
  duplicates: number;
}

const insertSql = new Map<Stream, string>();

/**
 * One statement per stream: bind each column as an array, insert what is new,
 * and mark the (vessel, fleet day) of every inserted row dirty for the daily
 * jobs — late data included. Duplicates are skipped by the primary key.
 */
function sqlFor(stream: Stream): string {
  let sql = insertSql.get(stream);
  if (sql) return sql;
  const { table, columns } = tableSpecs[stream];
  const names = columns.map(([name]) => name).join(', ');
  const binds = columns.map(([, type], i) => `$${i + 1}::${type.startsWith('json:') ? 'text[]' : type}`).join(', ');
  const values = columns
    .map(([name, type]) =>
      // JSON arrays "[1,2]" become PostgreSQL array literals "{1,2}".
      type.startsWith('json:') ? `translate(${name}, '[]', '{}')::${type.slice(5)}` : name,
    )
    .join(', ');
  const tz = `$${columns.length + 1}`;
  sql = `
    WITH incoming (${names}) AS (SELECT * FROM unnest(${binds})),
    ins AS (
      INSERT INTO ${table} (${names})
      SELECT ${values} FROM incoming
      ON CONFLICT DO NOTHING
      RETURNING vessel_id, t
    ),
    marks AS (
      INSERT INTO dirty_day (vessel_id, day)
      SELECT DISTINCT vessel_id, (t AT TIME ZONE ${tz})::date FROM ins
      ON CONFLICT (vessel_id, day) DO UPDATE SET marked_at = now()
      RETURNING 1
    )
    SELECT (SELECT count(*) FROM ins)::int AS inserted`;
  insertSql.set(stream, sql);
  return sql;
}

/**
 * Months (UTC) already known to have a partition, per table. Call
 * `forgetKnownPartitions()` when a write transaction rolls back: a partition
 * created inside it is gone again.
 */
const knownMonths = new Set<string>();

export function forgetKnownPartitions(): void {
  knownMonths.clear();
}

async function ensurePartitions(client: PoolClient, table: string, times: string[]) {
  const months = new Map<string, string>();
  for (const t of times) {
    const month = t.slice(0, 7);
    if (!knownMonths.has(`${table}:${month}`)) months.set(month, t);
  }
  for (const [month, t] of months) {
    await client.query('SELECT holdfast_ensure_partitions($1, $2, $2)', [table, t]);
    knownMonths.add(`${table}:${month}`);
  }
}

/** Store the batches in the caller's transaction. */
export async function writeBatches(client: PoolClient, batches: RecordBatch[], fleetTimeZone: string): Promise<WriteResult> {
  const byStream = new Map<Stream, unknown[][]>();
  for (const batch of batches) {
    const spec = tableSpecs[batch.stream] as (typeof tableSpecs)[Stream];
    const rows = byStream.get(batch.stream) ?? [];
    for (const record of batch.records) rows.push(...spec.rows(batch.vesselId, record as never));
    byStream.set(batch.stream, rows);
  }

  const result: WriteResult = { inserted: 0, duplicates: 0 };
  for (const [stream, rows] of byStream) {
    if (rows.length === 0) continue;
    const { table, columns } = tableSpecs[stream];
    const tIndex = columns.findIndex(([name]) => name === 't');
    await ensurePartitions(client, table, rows.map((row) => row[tIndex] as string));
    const params: unknown[] = columns.map((_, i) => rows.map((row) => row[i]));
    params.push(fleetTimeZone);
    const { rows: out } = await client.query<{ inserted: number }>(sqlFor(stream), params);
    const inserted = out[0]!.inserted;
    result.inserted += inserted;
    result.duplicates += rows.length - inserted;
  }
  return result;
}
