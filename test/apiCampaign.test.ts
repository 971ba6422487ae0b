import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET } from '../app/api/v1/campaigns/[key]/report/route';
import { addDays, fleetDay } from '../lib/time/fleetDay';
import { call, histogram, insertVesselDay, jsonOf, openApiValidator, parseCsv, startApiTest, stopApiTest, type ApiTest } from './apiHelpers';

/**
 * GET /api/v1/campaigns/{key}/report. The campaign runs from 5 days ago to
 * 10 days ahead, so the report covers today − 5 … today. Expected figures are
 * worked out by hand from the histograms below (bin k holds
 * [0.1·k, 0.1·(k+1)) m; metrics-v1 in-bin interpolation).
 */
describe('GET /api/v1/campaigns/{key}/report', () => {
  let t: ApiTest;
  const validator = openApiValidator();
  const today = fleetDay(new Date(), 'UTC');
  const from = addDays(today, -5);
  const to = addDays(today, 10);
  const report = (query = '', token: string | null = t.token) => call(GET, `/campaigns/north-spool/report${query}`, { key: 'north-spool' }, token);

  beforeAll(async () => {
    t = await startApiTest({ from, to });
    const skua = t.ids['kelvick-skua']!;
    const shag = t.ids['ardle-shag']!;
    const day = (offset: number) => addDays(today, offset);
    // Outside the period on both sides: would wreck p95 if counted.
    await insertVesselDay(t.db, skua, day(-6), { err_hist: histogram({ 90: 1000 }), samples: 1000, dp_hours: 24, limit_events: 50 });
    await insertVesselDay(t.db, skua, day(1), { err_hist: histogram({ 95: 1000 }), samples: 1000, dp_hours: 24, limit_events: 50 });
    // In the period: 100 samples in [1.0, 1.1) m, 100 in [3.0, 3.1) m, and a day without DP.
    await insertVesselDay(t.db, skua, day(-3), { err_hist: histogram({ 10: 100 }), samples: 100, dp_hours: 10, limit_events: 2, p95_m: 1.095 });
    await insertVesselDay(t.db, skua, day(-1), { err_hist: histogram({ 30: 100 }), samples: 100, dp_hours: 14.5, p95_m: 3.095 });
    await insertVesselDay(t.db, skua, day(0), { err_hist: null, samples: 0, dp_hours: 0, limit_events: 1 });
    // 90 samples in [0.5, 0.6) m and 10 beyond 10 m: p95 in the overflow bin.
    await insertVesselDay(t.db, shag, day(-2), { err_hist: histogram({ 5: 90, 100: 10 }), samples: 100, dp_hours: 5, limit_events: 0, blackouts: 1 });
  });
  afterAll(() => stopApiTest(t));

  it('reports each vessel over the campaign’s days up to today, p95 from the merged histograms', async () => {
    const body = await jsonOf(await report());
    expect(validator.errors('/campaigns/{key}/report', 200, body)).toEqual([]);
    expect(body.campaign).toEqual({
      key: 'north-spool',
      charterer: 'Example Charterer',
      from,
      to,
      site: { name: 'Example Field', lat: 60.5, lon: 2.25 },
      watch_circles_m: [2, 3.05],
    });
    expect(body.as_of).toBe(today);
    expect(body.period).toEqual({ from, to: today });
    const [shag, skua] = body.vessels;
    // N = 200; q·N = 190 falls in bin 30 (C = 100 before it, H = 100):
    // 3.0 + 0.1 · 90 / 100 = 3.09 m. The mean of the daily p95s would be 2.095.
    expect(skua).toMatchObject({ vessel: 'kelvick-skua', name: 'Kelvick Skua', days_computed: 3, dp_hours: 24.5, p95_overflow: false, limit_events: 3, blackouts: null });
    expect(skua.p95_m).toBeCloseTo(3.09, 9);
    // The campaign's circles, not the vessel's 3 and 5 m: below 2 m, 100 of 200;
    // below 3.05 m, 100 + half of bin 30 = 150 of 200.
    expect(Object.keys(skua.within_pct)).toEqual(['2', '3.05']);
    expect(skua.within_pct['2']).toBeCloseTo(50, 9);
    expect(skua.within_pct['3.05']).toBeCloseTo(75, 9);
    expect(shag).toEqual({
      vessel: 'ardle-shag',
      name: 'Ardle Shag, "the Shag"',
      days_computed: 1,
      dp_hours: 5,
      p95_m: 10,
      p95_overflow: true,
      within_pct: { '2': 90, '3.05': 90 },
      limit_events: 0,
      blackouts: 1,
    });
  });

  it('answers CSV, one row per vessel with the campaign’s limits as columns', async () => {
    const response = await report('?format=csv');
    expect(response.headers.get('content-disposition')).toBe(`attachment; filename="campaign-north-spool-${today}.csv"`);
    const [header, shag, skua] = parseCsv(await response.text());
    expect(header).toEqual(['vessel', 'name', 'days_computed', 'dp_hours', 'p95_m', 'p95_overflow', 'within_pct_2', 'within_pct_3.05', 'limit_events', 'blackouts']);
    expect(shag).toEqual(['ardle-shag', 'Ardle Shag, "the Shag"', '1', '5', '10', 'true', '90', '90', '0', '1']);
    expect(skua!.slice(0, 4)).toEqual(['kelvick-skua', 'Kelvick Skua', '3', '24.5']);
    expect(skua![9]).toBe('');
  });

  it('gives nulls, never zeros, for a campaign that has not started', async () => {
    await t.db.pool.query(`UPDATE campaign SET from_day = $1, to_day = $2 WHERE key = 'north-spool'`, [addDays(today, 3), to]);
    try {
      const body = await jsonOf(await report());
      expect(validator.errors('/campaigns/{key}/report', 200, body)).toEqual([]);
      expect(body.period).toBeNull();
      expect(body.vessels).toEqual(
        ['ardle-shag', 'kelvick-skua'].map((vessel) =>
          expect.objectContaining({ vessel, days_computed: 0, dp_hours: null, p95_m: null, p95_overflow: null, within_pct: { '2': null, '3.05': null }, limit_events: null, blackouts: null }),
        ),
      );
    } finally {
      await t.db.pool.query(`UPDATE campaign SET from_day = $1 WHERE key = 'north-spool'`, [from]);
    }
  });

  it('answers 404 for an unknown campaign and 401 without a token', async () => {
    const body = await jsonOf(await call(GET, '/campaigns/nope/report', { key: 'nope' }, t.token), 404);
    expect(body).toEqual({ error: { code: 'not_found', message: 'no campaign has the key "nope"' } });
    expect(validator.errors('/campaigns/{key}/report', 404, body)).toEqual([]);
    expect((await report('', null)).status).toBe(401);
    expect((await report('?format=html')).status).toBe(400);
  });
});
