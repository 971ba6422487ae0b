import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { writeInTransaction, type PreparedMessage } from '../ingest/storeWriter';
import { recomputeDays } from '../lib/jobs/dailyRollup';
import { efficiencyIndex } from '../lib/metrics/efficiency';
import { limitEventsPerDpDay, powerFigures } from '../lib/metrics/powerLimit';
import { refFigures } from '../lib/metrics/refs';
import { stationDayFigures } from '../lib/metrics/stationDay';
import { sumWearHours } from '../lib/metrics/wear';
import type { StationRecord, Stream, TelemetryRecord } from '../lib/telemetry/schemas';
import { fleetDay } from '../lib/time/fleetDay';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { randomTelemetry, type RandomTelemetry } from './helpers/randomTelemetry';

/**
 * The daily job against an independent computation: random records (every
 * skip rule exercised: optional fields missing, non-DP modes, blackouts,
 * units that ran without load bands) are stored through the ingest writer,
 * the job computes the days from the database, and the test computes the
 * same figures from the records in memory with the pure formulas of
 * lib/metrics (spec metrics-v1). Europe/Oslo, across the start of summer
 * time on 2026-03-29 (a 23-hour fleet day; source: IANA tz database, EU
 * summer time starts 01:00 UTC on the last Sunday of March).
 */

const TZ = 'Europe/Oslo';
const DAYS = ['2026-03-28', '2026-03-29', '2026-03-30'];
const LIMITS = [2.5, 5];
const THRUSTERS = { T1: 3, T2: 10 / 3 } as const;

function expectClose(actual: number | null | undefined, expected: number | null | undefined, label: string): void {
  if (expected === null || expected === undefined) {
    expect(actual ?? null, label).toBeNull();
    return;
  }
  expect(actual, label).not.toBeNull();
  expect(Math.abs(actual! - expected), `${label}: ${actual} vs ${expected}`).toBeLessThanOrEqual(1e-9 * Math.max(1, Math.abs(expected)));
}

describe('daily job = the metrics-v1 formulas on the same records', () => {
  let db: TestDatabase;
  let vesselId: number;
  let data: RandomTelemetry;
  const onDay = <T extends { t: string }>(records: T[], day: string) => records.filter((r) => fleetDay(r.t, TZ) === day);

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const v = await db.pool.query(
      `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
       VALUES ('eq-one', 'Eq One', 'construction', 2, $1, '{3,5}') RETURNING id`,
      [LIMITS],
    );
    vesselId = v.rows[0].id;
    for (const [unit, p] of Object.entries(THRUSTERS)) {
      await db.pool.query(
        `INSERT INTO thruster (vessel_id, unit_id, kind, rated_kw, life_exponent, service_interval_h) VALUES ($1, $2, 'azimuth', 1500, $3, 20000)`,
        [vesselId, unit, p],
      );
    }
    // From 22:00 UTC on 27 March (23:00 Oslo) to past the end of 30 March, Oslo time.
    data = randomTelemetry({
      seed: 20260329,
      from: new Date('2026-03-27T22:00:00Z'),
      intervals: 4 * 24 * 6,
      dt: 600,
      thrusters: Object.keys(THRUSTERS),
      buses: ['A', 'B'],
      refs: ['G1', 'H1'],
      gap: 0.15,
    });
    const messages: PreparedMessage[] = (['station', 'thrusters', 'power', 'refs'] as const).map((stream) => ({
      topic: `fleet/v1/eq-one/${stream}`,
      batch: { stream: stream as Stream, vesselId, records: data[stream] as TelemetryRecord[Stream][] },
      rejected: [],
    }));
    await writeInTransaction(db.pool, messages, TZ);
    await recomputeDays(db.pool, DAYS.map((day) => ({ vesselId, day })), TZ);
  });
  afterAll(async () => db?.drop());

  it('station and power figures per vessel-day', async () => {
    const { rows } = await db.pool.query(`SELECT v.*, v.day::text AS fleet_day FROM daily_vessel v WHERE vessel_id = $1 ORDER BY v.day`, [vesselId]);
    expect(rows.map((r) => r.fleet_day)).toEqual(DAYS);
    for (const { fleet_day: day, ...row } of rows) {
      const station = onDay(data.station, day);
      const power = onDay(data.power, day);
      const s = stationDayFigures(station, LIMITS);
      const p = powerFigures(power);
      const at = (what: string) => `${day} ${what}`;
      expect(row.station_records, at('station_records')).toBe(station.length);
      expect(row.dp_intervals, at('dp_intervals')).toBe(s.dp_intervals);
      expectClose(row.dp_hours, s.dp_hours, at('dp_hours'));
      expect(Number(row.samples), at('samples')).toBe(s.samples);
      expectClose(row.p50_m, s.p50?.m, at('p50'));
      expectClose(row.p95_m, s.p95?.m, at('p95'));
      expectClose(row.p99_m, s.p99?.m, at('p99'));
      expect(row.p95_overflow, at('p95_overflow')).toBe(s.p95?.overflow ?? null);
      expectClose(row.r_rms_m, s.r_rms, at('r_rms'));
      expectClose(row.r_max_m, s.r_max, at('r_max'));
      for (const l of LIMITS) expectClose(row.within_pct[String(l)], s.within_pct.get(l), at(`within_pct ${l}`));
      expectClose(row.hdg_rms_deg, s.hdg_rms, at('hdg_rms'));
      expectClose(row.hdg_max_abs_deg, s.hdg_max_abs, at('hdg_max_abs'));
      expectClose(row.wind_mean_ms, s.wind_ms_mean, at('wind'));
      expectClose(row.wind_beam_share, beamShare(station), at('wind beam share'));
      expect(row.wind_beam_share, at('wind beam share present')).not.toBeNull();
      expectClose(row.gust_max_ms, s.wind_gust_ms_max, at('gust'));
      expectClose(row.current_mean_ms, s.current_ms_mean, at('current'));
      expectClose(row.limit_events, p.limit_events, at('limit_events'));
      expectClose(row.limit_seconds, p.limit_seconds, at('limit_seconds'));
      expectClose(row.limit_events_per_dp_day, limitEventsPerDpDay(p.limit_events!, s.dp_hours), at('per dp day'));
      expect(row.blackouts, at('blackouts')).toBe(p.blackouts);
      expectClose(row.peak_load_ratio, p.peak_load_ratio, at('peak_load_ratio'));
    }
    // The 23-hour day has 23 h of 10-minute intervals.
    expect(rows[1].station_records).toBe(23 * 6);
    expect(rows[0].station_records).toBe(24 * 6);
  });

  it('per bus, per thruster and per reference system', async () => {
    for (const day of DAYS) {
      const buses = await db.pool.query(`SELECT * FROM daily_bus WHERE vessel_id = $1 AND day = $2 ORDER BY unit_id`, [vesselId, day]);
      expect(buses.rows.map((b) => b.unit_id)).toEqual(['A', 'B']);
      for (const b of buses.rows) {
        const p = powerFigures(onDay(data.power, day), b.unit_id);
        expectClose(b.limit_events, p.limit_events, `${day} ${b.unit_id} limit_events`);
        expectClose(b.limit_seconds, p.limit_seconds, `${day} ${b.unit_id} limit_seconds`);
        expect(b.blackouts).toBe(p.blackouts);
        expectClose(b.peak_load_ratio, p.peak_load_ratio, `${day} ${b.unit_id} peak`);
      }

      const thrusters = await db.pool.query(`SELECT * FROM daily_thruster WHERE vessel_id = $1 AND day = $2 ORDER BY unit_id`, [vesselId, day]);
      expect(thrusters.rows.map((t) => t.unit_id)).toEqual(Object.keys(THRUSTERS));
      for (const t of thrusters.rows) {
        const units = onDay(data.thrusters, day).flatMap((r) => r.units.filter((u) => u.id === t.unit_id));
        const wear = sumWearHours(units, { p: THRUSTERS[t.unit_id as keyof typeof THRUSTERS] });
        const at = (what: string) => `${day} ${t.unit_id} ${what}`;
        expectClose(t.run_hours, units.reduce((s, u) => s + u.run_s, 0) / 3600, at('run_hours'));
        expect(t.starts).toBe(units.reduce((s, u) => s + u.starts, 0));
        expectClose(t.wear_hours, wear.wear_hours, at('wear_hours'));
        expectClose(t.unbanded_run_s, wear.unbanded_run_s, at('unbanded_run_s'));
        expectClose(t.efficiency_index, efficiencyIndex(units), at('efficiency_index'));
        const travel = units.filter((u) => u.azimuth_travel_deg !== undefined);
        expectClose(t.azimuth_travel_deg, travel.length ? travel.reduce((s, u) => s + u.azimuth_travel_deg!, 0) : null, at('travel'));
      }

      const refs = await db.pool.query(`SELECT * FROM daily_ref WHERE vessel_id = $1 AND day = $2 ORDER BY unit_id`, [vesselId, day]);
      expect(refs.rows.map((r) => r.unit_id)).toEqual(['G1', 'H1']);
      for (const r of refs.rows) {
        const e = refFigures(onDay(data.refs, day), r.unit_id);
        expectClose(r.online_hours, e.online_hours, `${day} ${r.unit_id} online_hours`);
        expectClose(r.weight_mean, e.weight_mean, `${day} ${r.unit_id} weight_mean`);
        expectClose(r.sd_m_median, e.sd_m_median, `${day} ${r.unit_id} sd_m_median`);
        expectClose(r.rejections, e.rejections, `${day} ${r.unit_id} rejections`);
      }
    }
  });

  it('gives the same rows when a day is computed again', async () => {
    const snapshot = async () =>
      (
        await db.pool.query(
          `SELECT to_jsonb(v) - 'computed_at' AS v FROM daily_vessel v WHERE vessel_id = $1
           UNION ALL SELECT to_jsonb(t) - 'computed_at' FROM daily_thruster t WHERE vessel_id = $1
           UNION ALL SELECT to_jsonb(b) - 'computed_at' FROM daily_bus b WHERE vessel_id = $1
           UNION ALL SELECT to_jsonb(r) - 'computed_at' FROM daily_ref r WHERE vessel_id = $1 ORDER BY 1`,
          [vesselId],
        )
      ).rows;
    const before = await snapshot();
    expect(before.length).toBeGreaterThan(20);
    await recomputeDays(db.pool, DAYS.map((day) => ({ vesselId, day })), TZ);
    expect(await snapshot()).toEqual(before);
  });
});

/**
 * The wind's beam share of a day, straight from its records (docs/flags.md): the dt-weighted mean of
 * |sin(wind from − heading set point)| over DP intervals (auto_position) with wind, its direction and
 * a set point; undefined when there is none.
 */
function beamShare(records: readonly StationRecord[]): number | undefined {
  let sum = 0;
  let dt = 0;
  for (const r of records) {
    const from = r.env?.wind_from_deg;
    const hdg = r.sp?.hdg;
    if (r.mode !== 'auto_position' || from == null || hdg == null || !(r.env!.wind_ms! > 0)) continue;
    sum += r.dt * Math.abs(Math.sin(((from - hdg) * Math.PI) / 180));
    dt += r.dt;
  }
  return dt > 0 ? sum / dt : undefined;
}
