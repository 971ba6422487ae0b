import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';

/** `holdfast jobs run --from --to`: compute now, wait, same rows every time. */
describe('holdfast jobs run', () => {
  const key = `jobs-${uniqueSuffix()}`;
  let db: TestDatabase;

  const run = (...args: string[]) =>
    spawnSync(process.execPath, ['bin/holdfast.mjs', 'jobs', 'run', ...args], {
      env: { ...process.env, DATABASE_URL: db.url, LOG_LEVEL: 'warn', FLEET_TIME_ZONE: 'UTC' },
      encoding: 'utf8',
    });

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(key));
    const { rows } = await db.pool.query('SELECT id FROM vessel WHERE key = $1', [key]);
    // 2026-11-20: 30 DP minutes; 2026-11-21: 90 DP minutes.
    await db.pool.query(
      `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n)
       SELECT $1::int, t, 60, 'auto_position', 60, 0
         FROM generate_series('2026-11-20T10:00Z'::timestamptz, '2026-11-20T10:29Z', interval '1 minute') t
       UNION ALL
       SELECT $1::int, t, 60, 'auto_position', 60, 0
         FROM generate_series('2026-11-21T10:00Z'::timestamptz, '2026-11-21T11:29Z', interval '1 minute') t`,
      [rows[0].id],
    );
  });
  afterAll(async () => db?.drop());

  const daily = async () =>
    (await db.pool.query(`SELECT day, dp_hours, station_records FROM daily_vessel ORDER BY day`)).rows;

  it('computes every vessel-day of the range and waits until done', async () => {
    const result = run('--from', '2026-11-20', '--to', '2026-11-22');
    expect(result.status, result.stderr).toBe(0);
    expect(result.stdout).toMatch(/^computed 3 vessel-day\(s\): 1 vessel\(s\) × 3 day\(s\) 2026-11-20…2026-11-22 \(UTC\)/);
    expect(result.stderr).toContain('3/3 vessel-days');
    expect(await daily()).toEqual([
      { day: '2026-11-20', dp_hours: 0.5, station_records: 30 },
      { day: '2026-11-21', dp_hours: 1.5, station_records: 90 },
      // 2026-11-22 received no telemetry: no row (a gap, never zeros).
    ]);
  });

  it('gives the same rows when run again', async () => {
    const before = await daily();
    expect(run('--from', '2026-11-20', '--to', '2026-11-22').status).toBe(0);
    expect(await daily()).toEqual(before);
  });

  it('refuses a bad range with one line and exit code 2', () => {
    const result = run('--from', '2026-11-22', '--to', '2026-11-20');
    expect(result.status).toBe(2);
    expect(result.stderr.trim()).toBe('--from 2026-11-22 is after --to 2026-11-20');
    expect(run('--from', '2026-11-20').stderr.trim()).toBe('usage: holdfast jobs run --from YYYY-MM-DD --to YYYY-MM-DD');
  });
});
