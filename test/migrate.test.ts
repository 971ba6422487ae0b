import { cpSync, mkdtempSync, appendFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { pgExecutor } from '../lib/db/executor';
import { migrate } from '../lib/db/migrate';
import { DEFAULT_MIGRATIONS_DIR, loadMigrationFiles } from '../lib/db/migrationFiles';
import { createTestDatabase, type TestDatabase } from './helpers/db';

const SCHEMA_SNAPSHOT = `
  SELECT c.relname, c.relkind, a.attname, format_type(a.atttypid, a.atttypmod) AS type, a.attnotnull
    FROM pg_class c
    JOIN pg_namespace n ON n.oid = c.relnamespace AND n.nspname = 'public'
    LEFT JOIN pg_attribute a ON a.attrelid = c.oid AND a.attnum > 0 AND NOT a.attisdropped
   ORDER BY 1, 3`;

describe('migrations on plain PostgreSQL (partitions flavour)', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createTestDatabase();
  });
  afterAll(async () => db?.drop());

  it('applies every migration once, and a second run changes nothing', async () => {
    const first = await migrate(pgExecutor(db.pool), { store: 'auto' });
    expect(first.flavour).toBe('partitions');
    expect(first.applied).toEqual(loadMigrationFiles('partitions').map((m) => m.name));

    const before = (await db.pool.query(SCHEMA_SNAPSHOT)).rows;
    const second = await migrate(pgExecutor(db.pool), { store: 'auto' });
    expect(second).toEqual({ flavour: 'partitions', applied: [] });
    expect((await db.pool.query(SCHEMA_SNAPSHOT)).rows).toEqual(before);
  });

  it('keeps the recorded flavour and refuses to switch it', async () => {
    await expect(migrate(pgExecutor(db.pool), { store: 'timescale' })).rejects.toThrow(
      /created with the partitions flavour/,
    );
  });

  it('partitions the time-series tables by month and routes rows into them', async () => {
    const parts = await db.pool.query<{ parent: string; n: number }>(`
      SELECT p.relname AS parent, count(*)::int AS n
        FROM pg_inherits i JOIN pg_class p ON p.oid = i.inhparent
       WHERE p.relkind = 'p'
       GROUP BY 1 ORDER BY 1`);
    // One month back and three ahead were created by the migration itself.
    expect(parts.rows).toEqual(
      ['ts_power', 'ts_ref', 'ts_station', 'ts_thruster', 'ts_track'].map((parent) => ({ parent, n: 5 })),
    );

    // A month without a partition refuses rows until the partition exists.
    const insert = `INSERT INTO ts_track (vessel_id, t, lat, lon) VALUES (1, '2020-02-29T23:59:59Z', 1, 2)`;
    await expect(db.pool.query(insert)).rejects.toThrow(/no partition/);
    const created = await db.pool.query(
      `SELECT holdfast_ensure_partitions('ts_track', '2020-02-10Z', '2020-03-05Z') AS n`,
    );
    expect(created.rows[0].n).toBe(2);
    await db.pool.query(insert);
    const where = await db.pool.query(`SELECT tableoid::regclass::text AS part FROM ts_track WHERE vessel_id = 1`);
    expect(where.rows).toEqual([{ part: 'ts_track_p2020_02' }]);

    // Calling again creates nothing; boundaries are UTC whatever the session zone.
    await db.pool.query(`SET TIME ZONE 'Pacific/Auckland'`);
    const again = await db.pool.query(`SELECT holdfast_ensure_partitions('ts_track', '2020-02-01Z', '2020-03-31Z') AS n`);
    expect(again.rows[0].n).toBe(0);
    const bounds = await db.pool.query(
      `SELECT pg_get_expr(c.relpartbound, c.oid) AS b FROM pg_class c WHERE c.relname = 'ts_track_p2020_03'`,
    );
    await db.pool.query(`RESET TIME ZONE`);
    expect(bounds.rows[0].b).toMatch(/2020-03-01 00:00:00\+00|2020-03-01 13:00:00\+13/);
  });

  it('rejects a duplicate record key', async () => {
    await db.pool.query(
      `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES (7, now(), 60, 'auto_position', 60, 60)`,
    );
    const dup = await db.pool.query(
      `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n)
       SELECT vessel_id, t, dt, mode, dp_s, n FROM ts_station WHERE vessel_id = 7
       ON CONFLICT DO NOTHING`,
    );
    expect(dup.rowCount).toBe(0);
  });

  it('drops partitions older than each table’s retention, and only those', async () => {
    const dropped = await db.pool.query<{ part: string }>(
      `SELECT holdfast_apply_retention('2020-07-01Z') AS part`,
    );
    // Track keeps 90 days: February and March 2020 ended before 2020-04-02.
    expect(dropped.rows.map((r) => r.part).sort()).toEqual(['ts_track_p2020_02', 'ts_track_p2020_03']);
    const left = await db.pool.query(`SELECT count(*)::int AS n FROM ts_track WHERE vessel_id = 1`);
    expect(left.rows[0].n).toBe(0);
  });
});

describe('migration safety', () => {
  let db: TestDatabase;
  let dir: string;
  beforeAll(async () => {
    db = await createTestDatabase();
    dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-migrations-'));
    cpSync(DEFAULT_MIGRATIONS_DIR, dir, { recursive: true });
  });
  afterAll(async () => {
    rmSync(dir, { recursive: true, force: true });
    await db?.drop();
  });

  it('serialises concurrent runs: both succeed and each migration applies once', async () => {
    const [a, b] = await Promise.all([
      migrate(pgExecutor(db.pool), { store: 'partitions', dir }),
      migrate(pgExecutor(db.pool), { store: 'partitions', dir }),
    ]);
    expect([...a.applied, ...b.applied].sort()).toEqual(loadMigrationFiles('partitions', dir).map((m) => m.name));
  });

  it('refuses to run when an applied migration file was edited', async () => {
    appendFileSync(path.join(dir, '0001_register.sql'), '\n-- edited\n');
    await expect(migrate(pgExecutor(db.pool), { store: 'auto', dir })).rejects.toThrow(
      /0001_register was edited after it was applied/,
    );
  });

  it('rolls back every pending migration when one fails', async () => {
    cpSync(DEFAULT_MIGRATIONS_DIR, dir, { recursive: true });
    appendFileSync(path.join(dir, '9998_good.sql'), 'CREATE TABLE should_not_stay (id int);');
    appendFileSync(path.join(dir, '9999_bad.sql'), 'CREATE TABLE broken (id nosuchtype);');
    await expect(migrate(pgExecutor(db.pool), { store: 'auto', dir })).rejects.toThrow(/nosuchtype/);
    const left = await db.pool.query(`SELECT to_regclass('should_not_stay') AS t`);
    expect(left.rows[0].t).toBeNull();
  });
});
