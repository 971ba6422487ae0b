import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET } from '../app/api/v1/vessels/route';
import { LIST_VESSELS_SQL } from '../lib/api/queries/listVessels';
import { createApiToken, revokeApiToken } from '../lib/api/tokens';
import { call, insertFlag, jsonOf, openApiValidator, parseCsv, startApiTest, stopApiTest, type ApiTest } from './apiHelpers';

/** GET /api/v1/vessels, and the bearer-token check every data endpoint shares. */
describe('GET /api/v1/vessels', () => {
  let t: ApiTest;
  const validator = openApiValidator();
  const vessels = (token: string | null = t.token) => call(GET, '/vessels', {}, token);

  beforeAll(async () => {
    t = await startApiTest();
    const skua = t.ids['kelvick-skua']!;
    const now = Date.now();
    for (const minutesAgo of [90, 30, 5]) {
      await t.db.pool.query(`INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, $2, 60, 'auto_position', 60, 60)`, [
        skua,
        new Date(Math.floor(now / 1000) * 1000 - minutesAgo * 60_000),
      ]);
    }
    await insertFlag(t.db, skua, { subject: 'vessel', metric: 'p95_norm', status: 'open', openedDay: '2026-01-10', statistic: 2.5 });
    await insertFlag(t.db, skua, { subject: 'thruster:T1', metric: 'efficiency_index', status: 'acknowledged', openedDay: '2026-01-11', statistic: -3.1 });
    await insertFlag(t.db, skua, { subject: 'ref:GNSS1', metric: 'sd_m', status: 'closed', openedDay: '2026-01-05', statistic: 3.3 });
  });
  afterAll(() => stopApiTest(t));

  it('lists every vessel by key with its latest station time and flags not closed', async () => {
    const body = await jsonOf(await vessels());
    const { rows } = await t.db.pool.query(`SELECT max(t) AS t FROM ts_station`);
    expect(body).toEqual({
      vessels: [
        { key: 'ardle-shag', name: 'Ardle Shag, "the Shag"', type: 'construction', dp_class: 3, last_seen: null, open_flags: 0 },
        { key: 'kelvick-skua', name: 'Kelvick Skua', type: 'supply', dp_class: 2, last_seen: rows[0].t.toISOString(), open_flags: 2 },
      ],
    });
    expect(body.vessels[1].last_seen).toMatch(/^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}\.\d{3}Z$/);
    expect(validator.errors('/vessels', 200, body)).toEqual([]);
  });

  it('answers CSV: header row, CRLF, quoted fields, null as the empty field', async () => {
    const response = await call(GET, '/vessels?format=csv', {}, t.token);
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('text/csv; charset=utf-8; header=present');
    expect(response.headers.get('content-disposition')).toBe('attachment; filename="vessels.csv"');
    const text = await response.text();
    expect(text.startsWith('key,name,type,dp_class,last_seen,open_flags\r\nardle-shag,"Ardle Shag, ""the Shag""",construction,3,,0\r\n')).toBe(true);
    const records = parseCsv(text);
    expect(records).toHaveLength(3);
    expect(records[2]!.slice(0, 4)).toEqual(['kelvick-skua', 'Kelvick Skua', 'supply', '2']);
    expect(records[2]![5]).toBe('2');
    expect(validator.hasCsv('/vessels', 200)).toBe(true);
  });

  it('refuses an unknown format with 400', async () => {
    const response = await call(GET, '/vessels?format=xml', {}, t.token);
    const body = await jsonOf(response, 400);
    expect(body).toEqual({ error: { code: 'invalid_parameter', message: 'format: "xml" is not one of json, csv' } });
    expect(validator.errors('/vessels', 400, body)).toEqual([]);
  });

  it('answers 401 without a token, with a malformed, unknown or revoked one', async () => {
    const cases: [string | null, string][] = [
      [null, 'missing bearer token: send Authorization: Bearer <token>'],
      ['', 'the Authorization header must be "Bearer <token>"'],
      ['not-a-token', 'unknown or revoked token'],
      [`hf_${'A'.repeat(43)}`, 'unknown or revoked token'],
    ];
    for (const [token, message] of cases) {
      const response = await vessels(token);
      expect(response.headers.get('www-authenticate')).toBe('Bearer realm="holdfast"');
      const body = await jsonOf(response, 401);
      expect(body).toEqual({ error: { code: 'unauthorized', message } });
      expect(validator.errors('/vessels', 401, body)).toEqual([]);
    }
    const { id, token } = await createApiToken(t.db.pool, { name: 'soon revoked', role: 'fleet_manager' });
    expect((await vessels(token)).status).toBe(200);
    expect(await revokeApiToken(t.db.pool, id)).toBe(true);
    expect(await jsonOf(await vessels(token), 401)).toEqual({ error: { code: 'unauthorized', message: 'unknown or revoked token' } });
    // Any role reads everything until access control arrives.
    const charterer = await createApiToken(t.db.pool, { name: 'charterer', role: 'charterer', campaignKey: 'north-spool' });
    expect((await jsonOf(await vessels(charterer.token))).vessels).toHaveLength(2);
  });

  it('accepts the scheme in any case (RFC 7235)', async () => {
    const response = await GET(new Request('http://holdfast.test/api/v1/vessels', { headers: { authorization: `bearer ${t.token}` } }), {
      params: Promise.resolve({}),
    });
    expect(response.status).toBe(200);
  });

  it('stamps last_used_at at most once a minute', async () => {
    const { id, token } = await createApiToken(t.db.pool, { name: 'stamp', role: 'admin' });
    const stamp = async () =>
      (await t.db.pool.query<{ last_used_at: Date | null }>('SELECT last_used_at FROM api_token WHERE id = $1', [id])).rows[0]!
        .last_used_at;
    expect(await stamp()).toBeNull();
    await vessels(token);
    const first = await stamp();
    expect(first).toBeInstanceOf(Date);
    await vessels(token);
    expect(await stamp()).toEqual(first);
    // Older than a minute: the next request stamps again.
    await t.db.pool.query(`UPDATE api_token SET last_used_at = now() - interval '61 seconds' WHERE id = $1`, [id]);
    const old = await stamp();
    await vessels(token);
    expect((await stamp())!.getTime()).toBeGreaterThan(old!.getTime());
  });

  it('reads last_seen from the end of the primary key, not by scanning the table', async () => {
    const { rows } = await t.db.pool.query<{ 'QUERY PLAN': string }>(`EXPLAIN ${LIST_VESSELS_SQL}`);
    const plan = rows.map((r) => r['QUERY PLAN']).join('\n');
    expect(plan).toMatch(/Index Only Scan Backward|Index Scan Backward/);
    expect(plan).not.toMatch(/Seq Scan on ts_station/);
  });
});
