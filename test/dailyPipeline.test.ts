import mqtt, { type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { GET as vesselDaily } from '../app/api/v1/vessels/[key]/daily/route';
import { GET as refsDaily } from '../app/api/v1/vessels/[key]/refs/daily/route';
import { GET as thrustersDaily } from '../app/api/v1/vessels/[key]/thrusters/daily/route';
import type { IngestWorker } from '../ingest/worker';
import { createApiToken } from '../lib/api/tokens';
import { getSharedPool } from '../lib/db/sharedPool';
import { recomputeDays } from '../lib/jobs/dailyRollup';
import { startJobRunner, type JobRunner } from '../lib/jobs/runner';
import { silentLogger } from '../lib/log/logger';
import { readFleetFile } from '../lib/register/fleetFile';
import { call, jsonOf } from './apiHelpers';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { expectedDay, type ExpectedDay } from './helpers/expectedDay';
import { registerFleet, uniqueSuffix } from './helpers/fleet';
import { sampledVessel, type SampledVessel } from './helpers/sampledVessel';
import { testWorker } from './helpers/testWorker';
import { waitFor } from './helpers/waitFor';

/**
 * Issue 5, must-show 2: a fleet's telemetry, reduced from invented 1 Hz
 * samples, is published over MQTT to the ingest worker; the daily job runs;
 * the JSON API's daily figures are compared with figures the test computes
 * straight from the samples (test/helpers/expectedDay.ts). Then records of an
 * old day that were held back (a link outage) are published late, and the
 * scheduled job changes that day's figures within its recompute window.
 */

const DT = 600;
const DAYS = ['2026-10-05', '2026-10-06'];
const INTERVALS = (DAYS.length * 86_400) / DT;
/** Intervals of the first day that vessel A's gateway holds back until later. */
const HELD_BACK = (i: number) => i >= 30 && i < 60;
const LIMITS = [2, 3.5];
const LIFE = { T1: 3, T2: 10 / 3 };

describe('telemetry → MQTT → ingest → daily job → API, against figures computed from the samples', () => {
  const suffix = uniqueSuffix();
  const root = `pipe-${suffix}/v1`;
  const keys = [`pipe-a-${suffix}`, `pipe-b-${suffix}`];
  let db: TestDatabase;
  let worker: IngestWorker;
  let publisher: MqttClient;
  let token: string;
  let runner: JobRunner | undefined;
  const vessels = new Map<string, SampledVessel>();

  beforeAll(async () => {
    db = await createMigratedDatabase();
    process.env.DATABASE_URL = db.url;
    process.env.FLEET_TIME_ZONE = 'UTC';
    await registerFleet(
      db.url,
      readFleetFile(
        JSON.stringify({
          v: 1,
          vessels: keys.map((key) => ({
            key,
            name: key,
            type: 'construction',
            dp_class: 2,
            watch_circles_m: LIMITS,
            heading_limits_deg: [3, 5],
            thrusters: Object.entries(LIFE).map(([id, p]) => ({ id, kind: 'azimuth', rated_kw: 2000, life_exponent: p, service_interval_h: 20000 })),
            buses: [{ id: 'A', rated_kw: 6000 }, { id: 'B', rated_kw: 6000 }],
            refs: [{ id: 'GNSS1', kind: 'gnss' }, { id: 'HPR1', kind: 'hydroacoustic' }],
          })),
        }),
      ),
    );
    token = (await createApiToken(db.pool, { name: 'pipeline', role: 'admin' })).token;
    keys.forEach((key, k) =>
      vessels.set(
        key,
        sampledVessel({
          seed: 5000 + k,
          from: new Date(`${DAYS[0]}T00:00:00Z`),
          intervals: INTERVALS,
          dt: DT,
          thrusters: Object.keys(LIFE),
          buses: ['A', 'B'],
          refs: ['GNSS1', 'HPR1'],
          sigmaM: 0.8 + 0.4 * k,
        }),
      ),
    );
    worker = testWorker(db.pool, `holdfast-pipe-${suffix}`, root);
    await worker.start();
    publisher = await mqtt.connectAsync(inject('mqttUrl'), { clientId: `pipe-pub-${suffix}`, protocolVersion: 4 });
  }, 120_000);

  afterAll(async () => {
    await runner?.stop();
    await publisher?.endAsync();
    await worker?.stop();
    await getSharedPool().end();
    await db?.drop();
  });

  /** Publish a vessel's intervals that pass `which`: one single record, the rest as `records` batches per day. */
  async function publish(key: string, which: (i: number) => boolean): Promise<number> {
    const v = vessels.get(key)!;
    let records = 0;
    for (const stream of ['station', 'thrusters', 'power', 'refs'] as const) {
      const chosen = v[stream].filter((_, i) => which(i));
      if (chosen.length === 0) continue;
      await publisher.publishAsync(`${root}/${key}/${stream}`, JSON.stringify(chosen[0]), { qos: 1 });
      for (let i = 1; i < chosen.length; i += 100) {
        await publisher.publishAsync(`${root}/${key}/${stream}`, JSON.stringify({ records: chosen.slice(i, i + 100) }), { qos: 1 });
      }
      records += chosen.length;
    }
    return records;
  }

  /**
   * Records stored, every stream counted by its distinct (vessel, interval start): ts_thruster,
   * ts_ref and ts_power hold a row per unit, system or switchboard section.
   * Waiting on one stream alone let the job run before the others' rows had landed.
   */
  const storedRecords = async () =>
    (
      await db.pool.query(`SELECT (SELECT count(DISTINCT (vessel_id, t)) FROM ts_station) + (SELECT count(DISTINCT (vessel_id, t)) FROM ts_power)
                                + (SELECT count(DISTINCT (vessel_id, t)) FROM ts_thruster)
                                + (SELECT count(DISTINCT (vessel_id, t)) FROM ts_ref) AS n`)
    ).rows[0].n as number;
  let publishedRecords = 0;

  async function api(key: string) {
    const range = `from=${DAYS[0]}&to=${DAYS[1]}`;
    const q = `?${range}`;
    return {
      vessel: await jsonOf(await call(vesselDaily, `/vessels/${key}/daily${q}`, { key }, token)),
      thrusters: await jsonOf(await call(thrustersDaily, `/vessels/${key}/thrusters/daily${q}`, { key }, token)),
      refs: await jsonOf(await call(refsDaily, `/vessels/${key}/refs/daily${q}`, { key }, token)),
    };
  }

  const close = (actual: unknown, expected: number | null, label: string) => {
    if (expected === null) return expect(actual, label).toBeNull();
    expect(typeof actual, label).toBe('number');
    // Interval statistics travel as JSON and are stored as 32-bit floats: 1e-5 relative.
    expect(Math.abs((actual as number) - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(1e-5 * Math.max(1, Math.abs(expected)));
  };

  function compare(answer: Awaited<ReturnType<typeof api>>, day: string, e: ExpectedDay, label: string) {
    const at = (what: string) => `${label} ${day} ${what}`;
    const d = answer.vessel.days.find((x: { day: string }) => x.day === day);
    expect(d, at('row')).toBeDefined();
    for (const field of [
      'dp_hours', 'p50_m', 'p95_m', 'p99_m', 'r_rms_m', 'r_max_m', 'hdg_rms_deg', 'hdg_max_abs_deg', 'wind_mean_ms', 'gust_max_ms',
      'current_mean_ms', 'limit_events', 'limit_seconds', 'limit_events_per_dp_day', 'blackouts', 'peak_load_ratio',
    ] as const) {
      close(d[field], e[field] as number | null, at(field));
    }
    for (const l of LIMITS) close(d.within_pct[String(l)], e.within_pct[String(l)]!, at(`within_pct ${l}`));
    for (const [id, t] of Object.entries(e.thrusters)) {
      const row = answer.thrusters.days.find((x: { day: string; thruster: string }) => x.day === day && x.thruster === id);
      close(row.run_hours, t.run_hours, at(`${id} run_hours`));
      close(row.wear_hours, t.wear_hours, at(`${id} wear_hours`));
      close(row.starts, t.starts, at(`${id} starts`));
      close(row.efficiency_index, t.efficiency_index, at(`${id} efficiency_index`));
    }
    for (const [id, r] of Object.entries(e.refs)) {
      const row = answer.refs.days.find((x: { day: string; ref: string }) => x.day === day && x.ref === id);
      close(row.online_hours, r.online_hours, at(`${id} online_hours`));
      close(row.weight_mean, r.weight_mean, at(`${id} weight_mean`));
      close(row.sd_m_median, r.sd_m_median, at(`${id} sd_m_median`));
      close(row.rejections, r.rejections, at(`${id} rejections`));
    }
  }

  const expected = (key: string, day: string, stored?: (i: number) => boolean) =>
    expectedDay(vessels.get(key)!, DT, Date.parse(`${day}T00:00:00Z`), LIMITS, LIFE, stored);

  it('serves every daily figure as computed from the samples', async () => {
    const [a, b] = keys as [string, string];
    publishedRecords = (await publish(a, (i) => !HELD_BACK(i))) + (await publish(b, () => true));
    await waitFor(async () => (await storedRecords()) === publishedRecords, 60_000, 'every published record stored');
    const { rows } = await db.pool.query<{ id: number }>('SELECT id FROM vessel');
    await recomputeDays(db.pool, rows.flatMap((r) => DAYS.map((day) => ({ vesselId: r.id, day }))), 'UTC');

    const answerA = await api(a);
    const answerB = await api(b);
    for (const day of DAYS) {
      compare(answerA, day, expected(a, day, (i) => !HELD_BACK(i)), a);
      compare(answerB, day, expected(b, day), b);
    }
    // The held-back hours are missing from vessel A's first day only.
    expect(answerA.vessel.days[0].dp_hours).toBeLessThan(expected(a, DAYS[0]!).dp_hours);
  }, 120_000);

  it('recomputes an old day within the recompute window when its late records arrive', async () => {
    const a = keys[0]!;
    runner = await startJobRunner({ connectionString: db.url, pool: db.pool, timeZone: 'UTC', log: silentLogger });
    const before = (await api(a)).vessel.days[0];
    publishedRecords += await publish(a, HELD_BACK);
    await waitFor(async () => (await storedRecords()) === publishedRecords, 60_000, 'every late record stored');
    const full = expected(a, DAYS[0]!);
    // The dirty-day job runs every minute; done when no day is left dirty and the figures moved.
    const dirtyLeft = async () => (await db.pool.query('SELECT count(*)::int AS n FROM dirty_day')).rows[0].n as number;
    await waitFor(
      async () => (await dirtyLeft()) === 0 && Math.abs((await api(a)).vessel.days[0].dp_hours - full.dp_hours) < 1e-9,
      150_000,
      'the late day recomputed',
    );
    const answer = await api(a);
    expect(answer.vessel.days[0].dp_hours).toBeGreaterThan(before.dp_hours);
    compare(answer, DAYS[0]!, full, `${a} (late data)`);
    compare(answer, DAYS[1]!, expected(a, DAYS[1]!), `${a} (untouched day)`);
  }, 200_000);
});
