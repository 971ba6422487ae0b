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
 * Prints both, their ratio, and last `jobs_vessel_days_per_s=N`.
 * Target (issue 5): 500 vessel-days in under 10 s.
 *
 *   npm run bench:jobs            BENCH_DATABASE_URL=… to choose the server
 */
import { writeMessages, type PreparedMessage } from '../ingest/storeWriter';
import { recomputeDays, type VesselDay } from '../lib/jobs/dailyRollup';
import type { Stream, TelemetryRecord } from '../lib/telemetry/schemas';
import { addDays } from '../lib/time/fleetDay';
import { randomTelemetry } from '../test/helpers/randomTelemetry';
import { benchDatabase } from './benchEnv';

const VESSELS = Number(process.env.BENCH_VESSELS ?? 50);
const DAYS = Number(process.env.BENCH_DAYS ?? 10);
const FIRST_DAY = '2026-05-01';
const TZ = 'UTC';
const THRUSTERS = ['T1', 'T2', 'T3', 'T4', 'T5', 'T6'];
const BUSES = ['A', 'B'];
const REFS = ['GNSS1', 'GNSS2', 'HPR1'];

const seconds = (since: bigint) => Number(process.hrtime.bigint() - since) / 1e9;

async function main(): Promise<void> {
  const db = await benchDatabase();
  try {
    console.log(`bench:jobs on ${db.label}: ${VESSELS} vessels × ${DAYS} days = ${VESSELS * DAYS} vessel-days`);
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

    const scanStart = process.hrtime.bigint();
    await db.pool.query(`SELECT count(*), sum(dp_s), sum(cardinality(err_hist)) FROM ts_station`);
    await db.pool.query(`SELECT count(*), sum(run_s), sum(load_band_s[11]) FROM ts_thruster`);
    await db.pool.query(`SELECT count(*), sum(limit_s) FROM ts_power`);
    await db.pool.query(`SELECT count(*), sum(sd_m) FROM ts_ref`);
    const scan = seconds(scanStart);

    const work: VesselDay[] = [];
    for (let d = 0; d < DAYS; d++) for (const vesselId of ids) work.push({ vesselId, day: addDays(FIRST_DAY, d) });
    await db.pool.query('DELETE FROM dirty_day');
    const jobsStart = process.hrtime.bigint();
    await recomputeDays(db.pool, work, TZ, (done, total) => process.stderr.write(`\rcomputing: ${done}/${total} vessel-days`));
    const jobs = seconds(jobsStart);
    process.stderr.write('\n');

    const { rows: check } = await db.pool.query(
      `SELECT (SELECT count(*) FROM daily_vessel)::int AS vessel_days, (SELECT count(*) FROM daily_thruster)::int AS thruster_days`,
    );
    console.log(`daily rows: ${check[0].vessel_days} vessel-days, ${check[0].thruster_days} thruster-days`);
    console.log(`baseline (read every row once): ${scan.toFixed(2)} s`);
    console.log(`jobs (${work.length} vessel-days): ${jobs.toFixed(2)} s = ${(jobs / scan).toFixed(2)} × baseline; target < 10 s`);
    console.log(`jobs_vessel_days_per_s=${(work.length / jobs).toFixed(1)}`);
  } finally {
    await db.close();
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
