/**
 * bench:jobs — the daily job over 500 vessel-days of generated telemetry.
 *
 * Loads 50 vessels × 10 days of one-minute records (6 thrusters, 2 buses,
 * 3 reference systems each; test/helpers/randomTelemetry.ts): the first day
 * through the ingest writer, the other days as copies of it shifted in time
 * (loading is not what is measured). Then measures, in the same run and on
 * the same data:
 *   baseline  one sequential read of every stored row (count and a sum per
 *             table): the least any computation over these rows could cost;
 *   jobs      `recomputeDays` over all 500 vessel-days, as
 *             `holdfast jobs run --from --to` does.
 * Prints both, their ratio, the CPU seconds of this process and of the
 * database backends it used (wall time is noisy on a shared machine), and
 * last `jobs_vessel_days_per_s=N`.
 * Target (issue 5): 500 vessel-days in under 10 s.
 *
 *   npm run bench:jobs            BENCH_DATABASE_URL=… to choose the server
 *   BENCH_KEEP=1 npm run bench:jobs
 *                                 keep the loaded database and print its URL
 *   BENCH_REUSE=postgres://…/hf_bench_xxxx npm run bench:jobs
 *                                 skip loading: empty the daily tables of that
 *                                 kept database and time the job again (drop
 *                                 it yourself when done)
 */
import pg from 'pg';
import { createPool } from '../lib/db/pool';
import { writeMessages, type PreparedMessage } from '../ingest/storeWriter';
import { recomputeDays, type VesselDay } from '../lib/jobs/dailyRollup';
import type { Stream, TelemetryRecord } from '../lib/telemetry/schemas';
import { addDays } from '../lib/time/fleetDay';
import { randomTelemetry } from '../test/helpers/randomTelemetry';
import { benchDatabase, cpuSeconds, type BenchDatabase } from './benchEnv';

const VESSELS = Number(process.env.BENCH_VESSELS ?? 50);
const DAYS = Number(process.env.BENCH_DAYS ?? 10);
const FIRST_DAY = '2026-05-01';
const TZ = 'UTC';
const THRUSTERS = ['T1', 'T2', 'T3', 'T4', 'T5', 'T6'];
const BUSES = ['A', 'B'];
const REFS = ['GNSS1', 'GNSS2', 'HPR1'];

const seconds = (since: bigint) => Number(process.hrtime.bigint() - since) / 1e9;

/** A database kept by an earlier BENCH_KEEP run: nothing to drop on close. */
function keptDatabase(url: string): BenchDatabase {
  const pool = createPool(url, 8);
  return { url, pool, label: `kept database ${new URL(url).pathname.slice(1)}`, close: () => pool.end() };
}

/** Process ids of the database backends serving this database. */
async function backendPids(db: BenchDatabase): Promise<number[]> {
  const { rows } = await db.pool.query<{ pid: number }>(`SELECT pid FROM pg_stat_activity WHERE datname = current_database() AND backend_type = 'client backend'`);
  return rows.map((r) => r.pid);
}

/**
 * CPU seconds of the backends and of the parallel workers they start (Linux
 * /proc, same machine only). A worker lives for one query, so it is found in
 * pg_stat_activity (by its leader) while it runs and its last reading kept:
 * a slight undercount at worst. The polling has a connection of its own.
 */
async function databaseCpu(db: BenchDatabase, pids: readonly number[]): Promise<{ stop(): Promise<number> }> {
  const start = await Promise.all(pids.map((p) => cpuSeconds(p)));
  const watcher = new pg.Client({ connectionString: db.url });
  await watcher.connect();
  const workers = new Map<number, number>();
  const sample = async () => {
    const { rows } = await watcher.query<{ pid: number }>('SELECT pid FROM pg_stat_activity WHERE leader_pid = ANY($1) AND pid <> ALL($1)', [pids]);
    for (const { pid } of rows) {
      const cpu = await cpuSeconds(pid); // 0 once the worker has gone
      if (cpu > (workers.get(pid) ?? 0)) workers.set(pid, cpu);
    }
  };
  let polling = Promise.resolve();
  const timer = setInterval(() => {
    polling = polling.then(sample, () => {});
  }, 200);
  return {
    async stop() {
      clearInterval(timer);
      await polling;
      await watcher.end();
      const end = await Promise.all(pids.map((p) => cpuSeconds(p)));
      return end.reduce((s, e, i) => s + e - start[i]!, 0) + [...workers.values()].reduce((s, w) => s + w, 0);
    },
  };
}

async function main(): Promise<void> {
  const reuse = process.env.BENCH_REUSE;
  const db = reuse ? keptDatabase(reuse) : await benchDatabase();
  const keep = !reuse && process.env.BENCH_KEEP === '1';
  try {
    console.log(`bench:jobs on ${db.label}: ${VESSELS} vessels × ${DAYS} days = ${VESSELS * DAYS} vessel-days`);
    const ids = reuse ? await keptVessels(db) : await load(db);
    await measure(db, ids);
    if (keep) console.log(`kept for BENCH_REUSE: ${db.url}`);
  } finally {
    if (keep) await db.pool.end();
    else await db.close();
  }
}

/** The bench vessels of a kept database, with its daily tables emptied so the job starts as on a fresh load. */
async function keptVessels(db: BenchDatabase): Promise<number[]> {
  const { rows } = await db.pool.query<{ id: number }>(`SELECT id FROM vessel WHERE key LIKE 'bench-%' ORDER BY id`);
  if (rows.length !== VESSELS) throw new Error(`BENCH_REUSE: ${rows.length} bench vessels, expected ${VESSELS}`);
  await db.pool.query('TRUNCATE daily_vessel, daily_thruster, daily_bus, daily_ref');
  await db.pool.query('VACUUM ANALYZE daily_vessel, daily_thruster, daily_bus, daily_ref');
  return rows.map((r) => r.id);
}

/** Register the bench fleet and store its telemetry; returns the vessel ids. */
async function load(db: BenchDatabase): Promise<number[]> {
  const ids: number[] = [];
  for (let v = 0; v < VESSELS; v++) {
    const { rows } = await db.pool.query(
      `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
       VALUES ($1, $2, 'construction', 2, '{3,5}', '{3,5}') RETURNING id`,
      [`bench-${v}`, `Bench ${v}`],
    );
    ids.push(rows[0].id);
    for (const t of THRUSTERS) {
      await db.pool.query(
        `INSERT INTO thruster (vessel_id, unit_id, kind, rated_kw, service_interval_h) VALUES ($1, $2, 'azimuth', 2000, 25000)`,
        [rows[0].id, t],
      );
    }
  }

  // Day 1 goes through the ingest writer; days 2… are copies of it shifted
  // in time by SQL (the job's work per day is the same; loading is not timed).
  const loadStart = process.hrtime.bigint();
  const client = await db.pool.connect();
  try {
    await client.query('BEGIN');
    for (const [v, vesselId] of ids.entries()) {
      const data = randomTelemetry({
        seed: 100_003 + v,
        from: new Date(`${FIRST_DAY}T00:00:00Z`),
        intervals: 1440,
        dt: 60,
        thrusters: THRUSTERS,
        buses: BUSES,
        refs: REFS,
        gap: 0.02,
      });
      const messages: PreparedMessage[] = (['station', 'thrusters', 'power', 'refs'] as const).map((stream) => ({
        topic: `fleet/v1/bench-${v}/${stream}`,
        batch: { stream: stream as Stream, vesselId, records: data[stream] as TelemetryRecord[Stream][] },
        rejected: [],
      }));
      await writeMessages(client, messages, TZ);
      process.stderr.write(`\rloading day 1: vessel ${v + 1}/${VESSELS}`);
    }
    await client.query('COMMIT');
  } finally {
    client.release();
  }
  for (const table of ['ts_station', 'ts_thruster', 'ts_power', 'ts_ref']) {
    const { rows: cols } = await db.pool.query<{ column_name: string }>(
      `SELECT column_name FROM information_schema.columns WHERE table_name = $1 ORDER BY ordinal_position`,
      [table],
    );
    const names = cols.map((c) => c.column_name);
    const shifted = names.map((n) => (n === 't' ? 't + make_interval(days => k)' : n));
    await db.pool.query(
      `INSERT INTO ${table} (${names.join(', ')}) SELECT ${shifted.join(', ')} FROM ${table}, generate_series(1, $1::int - 1) AS k`,
      [DAYS],
    );
    process.stderr.write(`\rcopying day 1 to days 2…${DAYS}: ${table}      `);
  }
  const { rows: counted } = await db.pool.query(
    `SELECT (SELECT count(*) FROM ts_station) + (SELECT count(*) FROM ts_thruster) + (SELECT count(*) FROM ts_power) + (SELECT count(*) FROM ts_ref) AS n`,
  );
  const rows = Number(counted[0].n);
  process.stderr.write('\n');
  await db.pool.query('VACUUM ANALYZE');
  console.log(`loaded ${rows.toLocaleString('en')} rows in ${seconds(loadStart).toFixed(1)} s (not timed below)`);
  return ids;
}

/** The baseline scan, then the job over every vessel-day, with wall and CPU time. */
async function measure(db: BenchDatabase, ids: number[]): Promise<void> {
  const scanStart = process.hrtime.bigint();
  await db.pool.query(`SELECT count(*), sum(dp_s), sum(cardinality(err_hist)) FROM ts_station`);
  await db.pool.query(`SELECT count(*), sum(run_s), sum(load_band_s[11]) FROM ts_thruster`);
  await db.pool.query(`SELECT count(*), sum(limit_s) FROM ts_power`);
  await db.pool.query(`SELECT count(*), sum(sd_m) FROM ts_ref`);
  const scan = seconds(scanStart);

  const work: VesselDay[] = [];
  for (let d = 0; d < DAYS; d++) for (const vesselId of ids) work.push({ vesselId, day: addDays(FIRST_DAY, d) });
  await db.pool.query('DELETE FROM dirty_day');
  // Open the pool's connections first, so their backends are known when the CPU count starts.
  const warm = await Promise.all([db.pool.connect(), db.pool.connect()]);
  for (const c of warm) c.release();
  const pgCpu = await databaseCpu(db, await backendPids(db));
  const nodeCpu0 = process.cpuUsage();
  const jobsStart = process.hrtime.bigint();
  await recomputeDays(db.pool, work, TZ, (done, total) => process.stderr.write(`\rcomputing: ${done}/${total} vessel-days`));
  const jobs = seconds(jobsStart);
  const nodeCpu = process.cpuUsage(nodeCpu0);
  const pgSeconds = await pgCpu.stop();
  process.stderr.write('\n');

  const { rows: check } = await db.pool.query(
    `SELECT (SELECT count(*) FROM daily_vessel)::int AS vessel_days, (SELECT count(*) FROM daily_thruster)::int AS thruster_days`,
  );
  console.log(`daily rows: ${check[0].vessel_days} vessel-days, ${check[0].thruster_days} thruster-days`);
  console.log(`baseline (read every row once): ${scan.toFixed(2)} s`);
  console.log(`jobs (${work.length} vessel-days): ${jobs.toFixed(2)} s = ${(jobs / scan).toFixed(2)} × baseline; target < 10 s`);
  console.log(`jobs CPU: node ${((nodeCpu.user + nodeCpu.system) / 1e6).toFixed(2)} s, database backends and their workers ${pgSeconds.toFixed(2)} s`);
  console.log(`jobs_vessel_days_per_s=${(work.length / jobs).toFixed(1)}`);
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
