import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET } from '../app/api/v1/vessels/[key]/thrusters/route';
import { addDays, fleetDay } from '../lib/time/fleetDay';
import { call, jsonOf, openApiValidator, parseCsv, startApiTest, stopApiTest, type ApiTest } from './apiHelpers';

/**
 * GET /api/v1/vessels/{key}/thrusters: wear totals and service projection as
 * of today (UTC here). Expected figures are worked out by hand below.
 */
describe('GET /api/v1/vessels/{key}/thrusters', () => {
  let t: ApiTest;
  const validator = openApiValidator();
  const today = fleetDay(new Date(), 'UTC');

  beforeAll(async () => {
    t = await startApiTest();
    const wear: [string, number, number | null][] = [
      ['T1', -40, 50], // outside the 30-day window: counts in the total only
      ['T1', -10, 10],
      ['T1', -5, 20],
      ['T1', -2, null], // ran without load bands: unknown, not zero
      ['T1', -1, 30],
      ['T1', 1, 1000], // after as_of (a clock ahead): not counted
      ['T2', -3, 0.0001], // 2000 h at 0.0001 h/day: 20 million days ahead
      ['T9', -1, 99], // not registered: not listed
    ];
    for (const [unit, offset, hours] of wear) {
      await t.db.pool.query(
        `INSERT INTO daily_thruster (vessel_id, unit_id, day, run_hours, starts, wear_hours, unbanded_run_s)
         VALUES ($1, $2, $3, 12, 1, $4, 0)`,
        [t.ids['kelvick-skua'], unit, addDays(today, offset), hours],
      );
    }
  });
  afterAll(() => stopApiTest(t));

  it('totals wear since install and projects the service day from the trailing 30-day rate', async () => {
    const body = await jsonOf(await call(GET, '/vessels/kelvick-skua/thrusters', { key: 'kelvick-skua' }, t.token));
    expect(body).toEqual({
      vessel: 'kelvick-skua',
      as_of: today,
      thrusters: [
        // 100 at install + 50 + 10 + 20 + 30 = 210; 1000 − 210 = 790 to go;
        // rate (10 + 20 + 30) / 3 days with data = 20 h/day → ⌈790 / 20⌉ = 40 days.
        { id: 'T1', kind: 'tunnel', wear_hours_total: 210, wear_hours_to_service: 790, projected_service_day: addDays(today, 40) },
        // Beyond the 100-year horizon (and year 9999): no day, null.
        { id: 'T2', kind: 'azimuth', wear_hours_total: 0.0001, wear_hours_to_service: 1999.9999, projected_service_day: null },
        // Installed past its interval: overdue by 100 h, due today.
        { id: 'T3', kind: 'azimuth', wear_hours_total: 600, wear_hours_to_service: -100, projected_service_day: today },
      ],
    });
    expect(validator.errors('/vessels/{key}/thrusters', 200, body)).toEqual([]);
  });

  it('answers CSV, one row per registered thruster', async () => {
    const response = await call(GET, '/vessels/kelvick-skua/thrusters?format=csv', { key: 'kelvick-skua' }, t.token);
    expect(response.headers.get('content-disposition')).toBe(`attachment; filename="kelvick-skua-thrusters-${today}.csv"`);
    expect(parseCsv(await response.text())).toEqual([
      ['id', 'kind', 'wear_hours_total', 'wear_hours_to_service', 'projected_service_day'],
      ['T1', 'tunnel', '210', '790', addDays(today, 40)],
      ['T2', 'azimuth', '0.0001', '1999.9999', ''],
      ['T3', 'azimuth', '600', '-100', today],
    ]);
  });

  it('lists nothing for a vessel without thrusters, 404 for an unknown one', async () => {
    expect(await jsonOf(await call(GET, '/vessels/ardle-shag/thrusters', { key: 'ardle-shag' }, t.token))).toEqual({
      vessel: 'ardle-shag',
      as_of: today,
      thrusters: [],
    });
    const body = await jsonOf(await call(GET, '/vessels/nope/thrusters', { key: 'nope' }, t.token), 404);
    expect(validator.errors('/vessels/{key}/thrusters', 404, body)).toEqual([]);
    expect((await call(GET, '/vessels/kelvick-skua/thrusters', { key: 'kelvick-skua' }, null)).status).toBe(401);
  });
});
