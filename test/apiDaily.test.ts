import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET as refsDaily } from '../app/api/v1/vessels/[key]/refs/daily/route';
import { GET as thrustersDaily } from '../app/api/v1/vessels/[key]/thrusters/daily/route';
import { GET as vesselDaily } from '../app/api/v1/vessels/[key]/daily/route';
import { addDays, fleetDay } from '../lib/time/fleetDay';
import { call, insertVesselDay, jsonOf, openApiValidator, parseCsv, startApiTest, stopApiTest, type ApiTest } from './apiHelpers';

/** The three daily endpoints: ranges, defaults, nulls, CSV and errors. */

const FULL_DAY = {
  dp_hours: 23.5,
  p50_m: 0.8,
  p95_m: 1.95,
  p95_overflow: false,
  p99_m: 2.4,
  r_rms_m: 0.9,
  r_max_m: 3.2,
  within_pct: { '3': 99.5, '5': 100 },
  hdg_rms_deg: 0.4,
  hdg_max_abs_deg: 1.5,
  wind_mean_ms: 8.25,
  gust_max_ms: 14,
  current_mean_ms: 0.6,
  p95_norm: 1.05,
  limit_events: 3,
  limit_seconds: 42.5,
  limit_events_per_dp_day: 3.0638297872340425,
  blackouts: 0,
  peak_load_ratio: 0.93,
};

/** A day with no station record (only other streams arrived): dp_hours and accuracy figures null, never 0. */
const EMPTY_DAY = {
  dp_hours: null, // no station record that day (power or thruster records only)
  p50_m: null,
  p95_m: null,
  p95_overflow: null,
  p99_m: null,
  r_rms_m: null,
  r_max_m: null,
  within_pct: { '3': null, '5': null },
  hdg_rms_deg: null,
  hdg_max_abs_deg: null,
  wind_mean_ms: null,
  gust_max_ms: null,
  current_mean_ms: null,
  p95_norm: null,
  limit_events: null,
  limit_seconds: null,
  limit_events_per_dp_day: null,
  blackouts: null,
  peak_load_ratio: null,
};

describe('daily endpoints', () => {
  let t: ApiTest;
  const validator = openApiValidator();
  const skua = { key: 'kelvick-skua' };

  beforeAll(async () => {
    t = await startApiTest();
    const id = t.ids['kelvick-skua']!;
    await insertVesselDay(t.db, id, '2026-01-10', FULL_DAY);
    await insertVesselDay(t.db, id, '2026-01-11', { ...EMPTY_DAY, dp_intervals: 0 });
    // Computed under an older register that had a 4 m circle: kept as stored.
    await insertVesselDay(t.db, id, '2026-01-12', { ...FULL_DAY, within_pct: { '3': 97, '4': 99.25 } });
    await insertVesselDay(t.db, id, '2025-12-31', FULL_DAY);
    await insertVesselDay(t.db, t.ids['ardle-shag']!, '2026-01-10', FULL_DAY);
    await t.db.pool.query(
      `INSERT INTO daily_thruster (vessel_id, unit_id, day, run_hours, starts, azimuth_travel_deg, wear_hours, unbanded_run_s, efficiency_index)
       VALUES ($1, 'T2', '2026-01-10', 20, 4, 720.5, 6.25, 0, 0.21),
              ($1, 'T1', '2026-01-10', 10, 2, NULL, NULL, 36000, NULL),
              ($1, 'T1', '2026-01-11', 0, 0, NULL, 0, 0, NULL)`,
      [id],
    );
    await t.db.pool.query(
      `INSERT INTO daily_ref (vessel_id, unit_id, day, kind, online_hours, weight_mean, sd_m_median, rejections)
       VALUES ($1, 'HPR1', '2026-01-10', 'hydroacoustic', 12, 0.3, 0.45, 7),
              ($1, 'GNSS1', '2026-01-10', 'gnss', 24, 0.7, 0.12, 0),
              ($1, 'GNSS1', '2026-01-11', 'gnss', NULL, NULL, NULL, NULL)`,
      [id],
    );
  });
  afterAll(() => stopApiTest(t));

  describe('GET /api/v1/vessels/{key}/daily', () => {
    it('returns the computed days of the range, inclusive, with nulls kept null', async () => {
      const body = await jsonOf(await call(vesselDaily, '/vessels/kelvick-skua/daily?from=2026-01-01&to=2026-01-12', skua, t.token));
      expect(body).toEqual({
        vessel: 'kelvick-skua',
        days: [
          { day: '2026-01-10', ...FULL_DAY },
          { day: '2026-01-11', ...EMPTY_DAY },
          { day: '2026-01-12', ...FULL_DAY, within_pct: { '3': 97, '4': 99.25 } },
        ],
      });
      expect(validator.errors('/vessels/{key}/daily', 200, body)).toEqual([]);
      const edge = await jsonOf(await call(vesselDaily, '/vessels/kelvick-skua/daily?from=2026-01-11&to=2026-01-11', skua, t.token));
      expect(edge.days.map((d: { day: string }) => d.day)).toEqual(['2026-01-11']);
    });

    it('flattens within_pct to one column per limit in CSV, null as the empty field', async () => {
      const response = await call(vesselDaily, '/vessels/kelvick-skua/daily?from=2026-01-10&to=2026-01-12&format=csv', skua, t.token);
      expect(response.headers.get('content-disposition')).toBe('attachment; filename="kelvick-skua-daily-2026-01-10-2026-01-12.csv"');
      const [header, ...rows] = parseCsv(await response.text());
      expect(header).toEqual([
        'day', 'dp_hours', 'p50_m', 'p95_m', 'p95_overflow', 'p99_m', 'r_rms_m', 'r_max_m',
        'within_pct_3', 'within_pct_4', 'within_pct_5',
        'hdg_rms_deg', 'hdg_max_abs_deg', 'wind_mean_ms', 'gust_max_ms', 'current_mean_ms', 'p95_norm',
        'limit_events', 'limit_seconds', 'limit_events_per_dp_day', 'blackouts', 'peak_load_ratio',
      ]);
      expect(rows).toEqual([
        ['2026-01-10', '23.5', '0.8', '1.95', 'false', '2.4', '0.9', '3.2', '99.5', '', '100',
          '0.4', '1.5', '8.25', '14', '0.6', '1.05', '3', '42.5', '3.0638297872340425', '0', '0.93'],
        ['2026-01-11', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', '', ''],
        ['2026-01-12', '23.5', '0.8', '1.95', 'false', '2.4', '0.9', '3.2', '97', '99.25', '',
          '0.4', '1.5', '8.25', '14', '0.6', '1.05', '3', '42.5', '3.0638297872340425', '0', '0.93'],
      ]);
    });

    it('answers an empty range with a header row carrying the vessel’s limits', async () => {
      const response = await call(vesselDaily, '/vessels/kelvick-skua/daily?from=2026-02-01&to=2026-02-02&format=csv', skua, t.token);
      const records = parseCsv(await response.text());
      expect(records).toHaveLength(1);
      expect(records[0]!.filter((c) => c.startsWith('within_pct_'))).toEqual(['within_pct_3', 'within_pct_5']);
      const json = await jsonOf(await call(vesselDaily, '/vessels/kelvick-skua/daily?from=2026-02-01&to=2026-02-02', skua, t.token));
      expect(json).toEqual({ vessel: 'kelvick-skua', days: [] });
    });

    it('defaults to the 30 days ending today in the fleet time zone', async () => {
      const today = fleetDay(new Date(), 'UTC');
      const id = t.ids['kelvick-skua']!;
      await insertVesselDay(t.db, id, today, FULL_DAY);
      await insertVesselDay(t.db, id, addDays(today, -29), FULL_DAY);
      await insertVesselDay(t.db, id, addDays(today, -30), FULL_DAY);
      const body = await jsonOf(await call(vesselDaily, '/vessels/kelvick-skua/daily', skua, t.token));
      expect(body.days.map((d: { day: string }) => d.day)).toEqual([addDays(today, -29), today]);
      const onlyTo = await jsonOf(await call(vesselDaily, `/vessels/kelvick-skua/daily?to=${addDays(today, -1)}`, skua, t.token));
      expect(onlyTo.days.map((d: { day: string }) => d.day)).toEqual([addDays(today, -30), addDays(today, -29)]);
    });

    it('refuses bad days, reversed and too long ranges with 400', async () => {
      const cases: [string, string, string][] = [
        ['from=2026-02-30', 'invalid_day', 'from: "2026-02-30" is not a day YYYY-MM-DD'],
        ['from=2026-01-01&to=yesterday', 'invalid_day', 'to: "yesterday" is not a day YYYY-MM-DD'],
        ['from=', 'invalid_day', 'from: "" is not a day YYYY-MM-DD'],
        ['from=2026-01-12&to=2026-01-10', 'invalid_range', 'from 2026-01-12 is after to 2026-01-10'],
        ['from=2025-01-01&to=2026-01-02', 'range_too_long', 'from 2025-01-01 to 2026-01-02 is 367 days; at most 366 per request'],
        ['format=pdf', 'invalid_parameter', 'format: "pdf" is not one of json, csv'],
      ];
      for (const [query, code, message] of cases) {
        const body = await jsonOf(await call(vesselDaily, `/vessels/kelvick-skua/daily?${query}`, skua, t.token), 400);
        expect(body, query).toEqual({ error: { code, message } });
        expect(validator.errors('/vessels/{key}/daily', 400, body)).toEqual([]);
      }
      // 366 days (2024 is a leap year) is allowed.
      expect((await call(vesselDaily, '/vessels/kelvick-skua/daily?from=2024-01-01&to=2024-12-31', skua, t.token)).status).toBe(200);
    });

    it('answers 404 for an unknown vessel, and 401 before anything else', async () => {
      const body = await jsonOf(await call(vesselDaily, '/vessels/no-such/daily', { key: 'no-such' }, t.token), 404);
      expect(body).toEqual({ error: { code: 'not_found', message: 'no vessel has the key "no-such"' } });
      expect(validator.errors('/vessels/{key}/daily', 404, body)).toEqual([]);
      // Without a token, neither the key nor the range is looked at.
      expect((await call(vesselDaily, '/vessels/no-such/daily?from=bad', { key: 'no-such' }, null)).status).toBe(401);
    });
  });

  describe('GET /api/v1/vessels/{key}/thrusters/daily', () => {
    it('returns thruster-days by day then thruster, with unknown wear as null', async () => {
      const body = await jsonOf(await call(thrustersDaily, '/vessels/kelvick-skua/thrusters/daily?from=2026-01-10&to=2026-01-11', skua, t.token));
      expect(body).toEqual({
        vessel: 'kelvick-skua',
        days: [
          { day: '2026-01-10', thruster: 'T1', run_hours: 10, wear_hours: null, starts: 2, azimuth_travel_deg: null, efficiency_index: null },
          { day: '2026-01-10', thruster: 'T2', run_hours: 20, wear_hours: 6.25, starts: 4, azimuth_travel_deg: 720.5, efficiency_index: 0.21 },
          { day: '2026-01-11', thruster: 'T1', run_hours: 0, wear_hours: 0, starts: 0, azimuth_travel_deg: null, efficiency_index: null },
        ],
      });
      expect(validator.errors('/vessels/{key}/thrusters/daily', 200, body)).toEqual([]);
    });

    it('answers CSV, 400 and 404 like every daily endpoint', async () => {
      const response = await call(thrustersDaily, '/vessels/kelvick-skua/thrusters/daily?from=2026-01-10&to=2026-01-10&format=csv', skua, t.token);
      expect(parseCsv(await response.text())).toEqual([
        ['day', 'thruster', 'run_hours', 'wear_hours', 'starts', 'azimuth_travel_deg', 'efficiency_index'],
        ['2026-01-10', 'T1', '10', '', '2', '', ''],
        ['2026-01-10', 'T2', '20', '6.25', '4', '720.5', '0.21'],
      ]);
      expect((await call(thrustersDaily, '/vessels/kelvick-skua/thrusters/daily?to=2026-13-01', skua, t.token)).status).toBe(400);
      expect((await call(thrustersDaily, '/vessels/nope/thrusters/daily', { key: 'nope' }, t.token)).status).toBe(404);
    });
  });

  describe('GET /api/v1/vessels/{key}/refs/daily', () => {
    it('returns reference-system days by day then id, nulls kept', async () => {
      const body = await jsonOf(await call(refsDaily, '/vessels/kelvick-skua/refs/daily?from=2026-01-10&to=2026-01-11', skua, t.token));
      expect(body).toEqual({
        vessel: 'kelvick-skua',
        days: [
          { day: '2026-01-10', ref: 'GNSS1', online_hours: 24, weight_mean: 0.7, sd_m_median: 0.12, rejections: 0 },
          { day: '2026-01-10', ref: 'HPR1', online_hours: 12, weight_mean: 0.3, sd_m_median: 0.45, rejections: 7 },
          { day: '2026-01-11', ref: 'GNSS1', online_hours: null, weight_mean: null, sd_m_median: null, rejections: null },
        ],
      });
      expect(validator.errors('/vessels/{key}/refs/daily', 200, body)).toEqual([]);
    });

    it('answers CSV, 400 and 404 like every daily endpoint', async () => {
      const response = await call(refsDaily, '/vessels/kelvick-skua/refs/daily?from=2026-01-11&to=2026-01-11&format=csv', skua, t.token);
      expect(await response.text()).toBe('day,ref,online_hours,weight_mean,sd_m_median,rejections\r\n2026-01-11,GNSS1,,,,\r\n');
      expect((await call(refsDaily, '/vessels/kelvick-skua/refs/daily?from=2026-01-11&to=2026-01-01', skua, t.token)).status).toBe(400);
      expect((await call(refsDaily, '/vessels/nope/refs/daily', { key: 'nope' }, t.token)).status).toBe(404);
    });
  });
});
