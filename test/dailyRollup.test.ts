import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { recomputeDays, recomputeDirtyDays } from '../lib/jobs/dailyRollup';
import { maintainPartitions } from '../lib/jobs/partitionMaintenance';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';

describe('daily roll-up and dirty days', () => {
  let db: TestDatabase;
  let vesselId: number;
  beforeAll(async () => {
    db = await createMigratedDatabase();
    const v = await db.pool.query(
      `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
       VALUES ('roll-one', 'Roll One', 'supply', 2, '{3,5}', '{3,5}') RETURNING id`,
    );
    vesselId = v.rows[0].id;
    await db.pool.query(`SELECT holdfast_ensure_partitions('ts_station', '2026-03-01Z', '2026-04-30Z')`);
  });
  afterAll(async () => db?.drop());

  async function station(t: string, dpS: number) {
    await db.pool.query(
      `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, $2, 3600, 'auto_position', $3, 0)`,
      [vesselId, t, dpS],
    );
  }

  it('sums DP hours over the fleet-zone day, including a 23-hour DST day', async () => {
    // Europe/Oslo 2026-03-29 runs from 2026-03-28T23:00Z to 2026-03-29T22:00Z (23 h).
    // Source: IANA tz database (EU summer time starts 01:00 UTC, last Sunday of March).
    await station('2026-03-28T22:00:00Z', 3600); // 23:00 on the 28th, Oslo
    for (let h = 23; h < 23 + 23; h++) {
      const t = new Date(Date.UTC(2026, 2, 28, h)).toISOString();
      await station(t, 1800);
    }
    await station('2026-03-29T22:00:00Z', 3600); // 00:00 on the 30th, Oslo
    await recomputeDays(db.pool, [{ vesselId, day: '2026-03-29' }], 'Europe/Oslo');
    const row = await db.pool.query(`SELECT dp_hours, station_records FROM daily_vessel WHERE vessel_id = $1 AND day = '2026-03-29'`, [vesselId]);
    expect(row.rows[0]).toEqual({ dp_hours: 11.5, station_records: 23 });

    await recomputeDays(db.pool, [{ vesselId, day: '2026-03-29' }], 'UTC');
    const utc = await db.pool.query(`SELECT dp_hours, station_records FROM daily_vessel WHERE vessel_id = $1 AND day = '2026-03-29'`, [vesselId]);
    // UTC day 29: hours 00..21 at 0.5 h plus 22:00 at 1 h.
    expect(utc.rows[0]).toEqual({ dp_hours: 22 * 0.5 + 1, station_records: 23 });
  });

  it('recomputes dirty days once and clears their marks; a day without telemetry has no row (a gap, not zeros)', async () => {
    await db.pool.query(`INSERT INTO dirty_day (vessel_id, day) VALUES ($1, '2026-03-29'), ($1, '2026-04-10')`, [vesselId]);
    const done = await recomputeDirtyDays(db.pool, 'UTC');
    expect(done).toEqual([
      { vesselId, day: '2026-03-29' },
      { vesselId, day: '2026-04-10' },
    ]);
    expect((await db.pool.query('SELECT count(*)::int AS n FROM dirty_day')).rows[0].n).toBe(0);
    const empty = await db.pool.query(`SELECT dp_hours, station_records FROM daily_vessel WHERE day = '2026-04-10'`);
    expect(empty.rows).toEqual([]);
    expect(await recomputeDirtyDays(db.pool, 'UTC')).toEqual([]);
  });

  it('two concurrent runs never take the same vessel-day', async () => {
    const days = Array.from({ length: 40 }, (_, i) => `2026-04-${String((i % 28) + 1).padStart(2, '0')}`);
    const unique = [...new Set(days)];
    await db.pool.query(`INSERT INTO dirty_day (vessel_id, day) SELECT $1, unnest($2::date[])`, [vesselId, unique]);
    const [a, b] = await Promise.all([recomputeDirtyDays(db.pool, 'UTC', 5), recomputeDirtyDays(db.pool, 'UTC', 5)]);
    const taken = [...a, ...b].map((d) => d.day);
    expect(new Set(taken).size).toBe(taken.length);
  });

  it('recomputing a day re-evaluates p95_norm of the days whose baseline holds it', async () => {
    // 150 stored days (2025-01-01 …) that follow p95 = 0.4 + 0.02·W² exactly
    // (synthetic), written without p95_norm, as if computed before a fit existed.
    const v = await db.pool.query(
      `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
       VALUES ('norm-one', 'Norm One', 'supply', 2, '{3,5}', '{3,5}') RETURNING id`,
    );
    const id = v.rows[0].id;
    await db.pool.query(
      `INSERT INTO daily_vessel (vessel_id, day, station_records, dp_intervals, dp_hours, samples, p95_m, p95_overflow, wind_mean_ms)
       SELECT $1, date '2025-01-01' + i, 1, 1, 1, 1, 0.4 + 0.02 * w * w, false, w
         FROM generate_series(0, 149) AS i, LATERAL (SELECT 3 + (i * 7) % 13 AS w) x`,
      [id],
    );
    const norm = async (day: string) =>
      (await db.pool.query(`SELECT p95_norm FROM daily_vessel WHERE vessel_id = $1 AND day = $2`, [id, day])).rows[0]?.p95_norm;
    expect(await norm('2025-04-30')).toBeNull();
    // Day 0 received no telemetry, so recomputing it removes its row; every
    // day up to day 119 has day 0 in its baseline and is re-evaluated.
    await recomputeDays(db.pool, [{ vesselId: id, day: '2025-01-01' }], 'UTC');
    expect(await norm('2025-01-01')).toBeUndefined();
    expect(await norm('2025-04-30')).toBeCloseTo(1, 9); // day 119
    expect(await norm('2025-05-01')).toBeNull(); // day 120: outside the re-evaluated range, untouched
  });

  it('keeps partitions three months ahead', async () => {
    const { created } = await maintainPartitions(db.pool, new Date('2030-01-15T00:00:00Z'));
    // 2030-01 .. 2030-04 for each of the five tables.
    expect(created).toBe(20);
    expect((await maintainPartitions(db.pool, new Date('2030-01-15T00:00:00Z'))).created).toBe(0);
  });
});
