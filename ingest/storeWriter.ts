import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Pool, PoolClient } from 'pg';
import { from as copyFrom } from 'pg-copy-streams';
import type { Rejection } from '../lib/telemetry/parsePayload';
import { STREAMS, type Stream, type TelemetryRecord } from '../lib/telemetry/schemas';
import { tableSpecs } from '../lib/telemetry/tables';
import { recordBatch, type RecordBatch } from './recordBatch';

export type { RecordBatch } from './recordBatch';

/** Records not rendered yet: what tests and benchmarks that load data through the writer hand it. */
export interface RecordList {
  stream: Stream;
  vesselId: number;
  records: TelemetryRecord[Stream][];
}

/** A rejection on its way to the quarantine table. */
export interface Quarantined extends Rejection {
  topic: string;
  vesselKey?: string;
  stream?: string;
}

/** What one MQTT message contributes to a flush. */
export interface PreparedMessage {
  topic: string;
  /** The ingest worker renders its records when it reads them; a plain list is rendered at the flush. */
  batch?: RecordBatch | RecordList;
  rejected: Quarantined[];
}

/** The batch rendered (a plain record list is rendered now). */
export function rendered(batch: RecordBatch | RecordList): RecordBatch {
  return 'copy' in batch ? batch : recordBatch(batch.stream, batch.vesselId, batch.records, () => batch.records);
}

/** Table rows a batch becomes: one per record, or one per unit for per-unit streams. */
export function rowsIn(batch: RecordBatch | RecordList | undefined): number {
  return batch ? rendered(batch).rows : 0;
}

export interface StreamResult {
  /** Rows stored (one per unit for per-unit streams). */
  inserted: number;
  /** Rows whose key was already stored: the first copy wins. */
  duplicates: number;
}

export interface WriteResult extends StreamResult {
  quarantined: number;
  byStream: Partial<Record<Stream, StreamResult>>;
}

/** Quarantined payloads are cut to this many characters (docs/telemetry.md). */
export const QUARANTINE_PAYLOAD_CHARS = 65_536;

const stagingReady = new WeakSet<PoolClient>();

/**
 * One temporary staging table per time-series table, per connection, emptied
 * at every commit. COPY fills it; one INSERT … ON CONFLICT DO NOTHING moves
 * the rows whose keys are new.
 */
async function ensureStaging(client: PoolClient): Promise<void> {
  if (stagingReady.has(client)) return;
  for (const stream of STREAMS) {
    const { table } = tableSpecs[stream];
    await client.query(`CREATE TEMP TABLE IF NOT EXISTS stage_${table} (LIKE ${table}) ON COMMIT DELETE ROWS`);
  }
  stagingReady.add(client);
}

/** COPY data goes out in chunks of about this many bytes: one stream write per message costs more than the COPY itself. */
const COPY_CHUNK_BYTES = 256 * 1024;

/**
 * Open `count` connections and give each its staging tables now, so that
 * the first flushes after a start do not wait for it (creating them took
 * the first flushes of a worker 0.5–1 s). Connections idle for long are
 * closed by the pool; a flush on a new one prepares it itself.
 */
export async function prepareConnections(pool: Pool, count: number): Promise<void> {
  const clients = await Promise.all(Array.from({ length: count }, () => pool.connect()));
  try {
    await Promise.all(clients.map((client) => ensureStaging(client)));
  } finally {
    for (const client of clients) client.release();
  }
}

async function copyRows(client: PoolClient, table: string, columns: readonly string[], texts: Buffer[]) {
  const chunks = function* () {
    let chunk: Buffer[] = [];
    let bytes = 0;
    for (const text of texts) {
      chunk.push(text);
      bytes += text.length;
      if (bytes >= COPY_CHUNK_BYTES) {
        yield Buffer.concat(chunk, bytes);
        chunk = [];
        bytes = 0;
      }
    }
    if (bytes > 0) yield Buffer.concat(chunk, bytes);
  };
  await pipeline(Readable.from(chunks()), client.query(copyFrom(`COPY stage_${table} (${columns.join(', ')}) FROM STDIN`)));
}

/** Move the staged rows whose keys are new; the first stored copy of a key wins. */
const moveSql = (table: string) => `INSERT INTO ${table} SELECT * FROM stage_${table} ON CONFLICT DO NOTHING`;

/**
 * Mark the (vessel, fleet day) of every staged row dirty — duplicates too:
 * recomputing a day costs less than finding out, row by row, which were new.
 * One statement per flush, keys in one fixed order, so two flushes running at
 * once wait for each other instead of deadlocking; a mark that exists already
 * is left as it is.
 */
const markSql = (tables: string[]) => `
  INSERT INTO dirty_day (vessel_id, day)
  SELECT DISTINCT vessel_id, (t AT TIME ZONE $1)::date
    FROM (${tables.map((table) => `SELECT vessel_id, t FROM stage_${table}`).join(' UNION ALL ')}) AS staged
  ORDER BY 1, 2
  ON CONFLICT (vessel_id, day) DO NOTHING`;

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

async function writeQuarantine(client: PoolClient, rejected: Quarantined[]) {
  if (rejected.length === 0) return;
  const text = (r: Quarantined) =>
    (typeof r.payload === 'string' ? r.payload : (JSON.stringify(r.payload) ?? String(r.payload))).slice(0, QUARANTINE_PAYLOAD_CHARS);
  await client.query(
    `INSERT INTO quarantine (topic, vessel_key, stream, reason, detail, payload)
     SELECT * FROM unnest($1::text[], $2::text[], $3::text[], $4::text[], $5::text[], $6::text[])`,
    [
      rejected.map((r) => r.topic),
      rejected.map((r) => r.vesselKey ?? null),
      rejected.map((r) => r.stream ?? null),
      rejected.map((r) => r.reason),
      rejected.map((r) => r.detail),
      rejected.map(text),
    ],
  );
}

/**
 * Store the messages in the caller's transaction: their rows (duplicates
 * skipped by the primary keys), their rejections, and a dirty mark for the
 * (vessel, fleet day) of every row received — late data included.
 */
export async function writeMessages(client: PoolClient, messages: PreparedMessage[], fleetTimeZone: string): Promise<WriteResult> {
  await ensureStaging(client);
  const byStream = new Map<Stream, { texts: Buffer[]; rows: number; months: string[] }>();
  const rejected: Quarantined[] = [];
  for (const message of messages) {
    for (const r of message.rejected) rejected.push(r);
    const batch = message.batch && rendered(message.batch);
    if (!batch || batch.rows === 0) continue;
    let staged = byStream.get(batch.stream);
    if (!staged) byStream.set(batch.stream, (staged = { texts: [], rows: 0, months: [] }));
    staged.texts.push(batch.copy);
    staged.rows += batch.rows;
    for (const t of batch.months) staged.months.push(t);
  }

  const result: WriteResult = { inserted: 0, duplicates: 0, quarantined: rejected.length, byStream: {} };
  for (const [stream, staged] of byStream) {
    const { table, columns } = tableSpecs[stream];
    await ensurePartitions(client, table, staged.months);
    await copyRows(client, table, columns, staged.texts);
  }
  if (byStream.size > 0) await client.query(markSql([...byStream.keys()].map((stream) => tableSpecs[stream].table)), [fleetTimeZone]);
  for (const [stream, { rows }] of byStream) {
    const inserted = (await client.query(moveSql(tableSpecs[stream].table))).rowCount ?? 0;
    result.byStream[stream] = { inserted, duplicates: rows - inserted };
    result.inserted += inserted;
    result.duplicates += rows - inserted;
  }
  await writeQuarantine(client, rejected);
  return result;
}

/** `writeMessages` in a transaction of its own, on a connection from `pool`. */
export async function writeInTransaction(pool: Pool, messages: PreparedMessage[], fleetTimeZone: string): Promise<WriteResult> {
  const client = await pool.connect();
  try {
    await client.query('BEGIN');
    const result = await writeMessages(client, messages, fleetTimeZone);
    await client.query('COMMIT');
    return result;
  } catch (error) {
    await client.query('ROLLBACK').catch(() => {});
    // Whatever the transaction created is gone again: staging tables, partitions.
    stagingReady.delete(client);
    forgetKnownPartitions();
    throw error;
  } finally {
    client.release();
  }
}
