import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { getFleetOverview } from '../lib/queries/fleetOverview';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';

const MIN = 60_000;
const HOUR = 60 * MIN;
const DAY = 24 * HOUR;

// A whole minute near the real clock, so the rows land in the partitions the
// migration created; every expectation below is relative to it.
const now = new Date(Math.floor(Date.now() / MIN) * MIN);
const ago = (ms: number) => new Date(now.getTime() - ms);

const zero = { station: 0, thrusters: 0, power: 0, refs: 0, track: 0 };

describe('getFleetOverview', () => {
  let db: TestDatabase;
  const ids: Record<string, number> = {};

  async function vessel(key: string, name: string, type: string, dpClass: number) {
    const { rows } = await db.pool.query<{ id: number }>(
      `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
       VALUES ($1, $2, $3, $4, '{3,5}', '{3,6}') RETURNING id`,
      [key, name, type, dpClass],
    );
    ids[key] = rows[0]!.id;
    return rows[0]!.id;
  }
  const station = (v: number, t: Date) =>
    db.pool.query(
      `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, $2, 60, 'auto_position', 60, 60)`,
      [v, t],
    );
  const thruster = (v: number, unit: string, t: Date) =>
    db.pool.query(`INSERT INTO ts_thruster (vessel_id, unit_id, t, dt, run_s, starts) VALUES ($1, $2, $3, 60, 60, 0)`, [
      v,
      unit,
      t,
    ]);
  const power = (v: number, unit: string, t: Date) =>
    db.pool.query(`INSERT INTO ts_power (vessel_id, unit_id, t, dt) VALUES ($1, $2, $3, 60)`, [v, unit, t]);
  const ref = (v: number, unit: string, t: Date) =>
    db.pool.query(`INSERT INTO ts_ref (vessel_id, unit_id, t, dt) VALUES ($1, $2, $3, 60)`, [v, unit, t]);
  const track = (v: number, t: Date) =>
    db.pool.query(`INSERT INTO ts_track (vessel_id, t, lat, lon) VALUES ($1, $2, 60.1, 5.2)`, [v, t]);

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await db.pool.query(
      `SELECT holdfast_ensure_partitions(table_name, $1, $2) FROM holdfast_retention`,
      [ago(40 * DAY), new Date(now.getTime() + DAY)],
    );

    // Names sort differently from keys and insertion order.
    const gull = await vessel('norrin-gull', 'Norrin Gull', 'PSV', 2);
    const auk = await vessel('aldren-auk', 'Aldren Auk', 'CSV', 3);
    await vessel('frennick-tern', 'Frennick Tern', 'ROV support', 1);

    // Norrin Gull: reporting now.
    // station: 3 in the window; exactly 24 h ago and 30 h ago are outside.
    for (const t of [now, ago(1 * MIN), ago(10 * MIN), ago(DAY), ago(30 * HOUR)]) await station(gull, t);
    // thrusters: three units at two times, one unit alone at a third time -> 3
    // records from 7 rows; one more 25 h ago is outside.
    for (const unit of ['T1', 'T2', 'T3']) {
      await thruster(gull, unit, ago(1 * MIN));
      await thruster(gull, unit, ago(2 * MIN));
    }
    await thruster(gull, 'T1', ago(3 * MIN));
    await thruster(gull, 'T2', ago(25 * HOUR));
    // power: two buses at one time, one bus just inside the window -> 2.
    await power(gull, 'B1', ago(5 * MIN));
    await power(gull, 'B2', ago(5 * MIN));
    await power(gull, 'B1', ago(DAY - MIN));
    // refs: only an old record -> 0.
    await ref(gull, 'R1', ago(2 * DAY));
    // track: 4 in the window, and one stamped after `now` that is ignored.
    for (const m of [1, 2, 3, 4]) await track(gull, ago(m * MIN));
    await track(gull, new Date(now.getTime() + MIN));

    // Aldren Auk: silent for three days; its latest record is a ref unit's.
    await station(auk, ago(5 * DAY));
    await ref(auk, 'R1', ago(4 * DAY));
    await ref(auk, 'R2', ago(3 * DAY));
    await ref(auk, 'R1', ago(3 * DAY));

    // Frennick Tern: registered, never reported.

    // Telemetry of a vessel id that is not registered is not shown.
    await station(999_999, ago(MIN));
    await thruster(999_999, 'T1', ago(MIN));
  });

  afterAll(async () => db?.drop());

  it('returns every registered vessel by name with its last record and 24 h record counts', async () => {
    expect(await getFleetOverview(db.pool, now)).toEqual([
      {
        key: 'aldren-auk',
        name: 'Aldren Auk',
        type: 'CSV',
        dpClass: 3,
        lastRecordAt: ago(3 * DAY),
        records24h: zero,
      },
      {
        key: 'frennick-tern',
        name: 'Frennick Tern',
        type: 'ROV support',
        dpClass: 1,
        lastRecordAt: null,
        records24h: zero,
      },
      {
        key: 'norrin-gull',
        name: 'Norrin Gull',
        type: 'PSV',
        dpClass: 2,
        lastRecordAt: now,
        records24h: { station: 3, thrusters: 3, power: 2, refs: 0, track: 4 },
      },
    ]);
  });

  it('reads the 24 h ending at the given instant and ignores later records', async () => {
    // Two hours earlier the window is (now - 26 h, now - 2 h].
    const earlier = await getFleetOverview(db.pool, ago(2 * HOUR));
    const gull = earlier.find((r) => r.key === 'norrin-gull');
    expect(gull?.lastRecordAt).toEqual(ago(DAY - MIN));
    expect(gull?.records24h).toEqual({ station: 1, thrusters: 1, power: 1, refs: 0, track: 0 });

    // Before Aldren Auk's refs, its last record is the station record.
    const before = await getFleetOverview(db.pool, ago(4 * DAY + HOUR));
    expect(before.find((r) => r.key === 'aldren-auk')?.lastRecordAt).toEqual(ago(5 * DAY));
  });

  it('counts a record once when several units report the same interval', async () => {
    const v = ids['frennick-tern']!;
    for (const unit of ['T1', 'T2', 'T3', 'T4']) await thruster(v, unit, ago(MIN));
    for (const unit of ['B1', 'B2']) await power(v, unit, ago(MIN));
    for (const unit of ['GNSS1', 'GNSS2', 'HPR']) await ref(v, unit, ago(2 * MIN));
    const frennick = (await getFleetOverview(db.pool, now)).find((r) => r.key === 'frennick-tern');
    expect(frennick).toEqual({
      key: 'frennick-tern',
      name: 'Frennick Tern',
      type: 'ROV support',
      dpClass: 1,
      lastRecordAt: ago(MIN),
      records24h: { station: 0, thrusters: 1, power: 1, refs: 1, track: 0 },
    });
  });

  it('returns no rows for an empty register', async () => {
    const empty = await createMigratedDatabase();
    try {
      expect(await getFleetOverview(empty.pool, now)).toEqual([]);
    } finally {
      await empty.drop();
    }
  });
});
