import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET } from '../app/api/v1/flags/route';
import { call, insertFlag, jsonOf, openApiValidator, parseCsv, startApiTest, stopApiTest, type ApiTest } from './apiHelpers';

/** GET /api/v1/flags: status and vessel filters, newest first, CSV, errors. */
describe('GET /api/v1/flags', () => {
  let t: ApiTest;
  const validator = openApiValidator();
  const ids: Record<string, number> = {};
  const flags = (query = '') => call(GET, `/flags${query}`, {}, t.token);
  const idsOf = async (query: string) => (await jsonOf(await flags(query))).flags.map((f: { id: number }) => f.id);

  beforeAll(async () => {
    t = await startApiTest();
    const skua = t.ids['kelvick-skua']!;
    const shag = t.ids['ardle-shag']!;
    ids.open = await insertFlag(t.db, skua, { subject: 'vessel', metric: 'p95_norm', status: 'open', openedDay: '2026-01-10', statistic: 2.75 });
    ids.ack = await insertFlag(t.db, skua, { subject: 'thruster:T1', metric: 'efficiency_index', status: 'acknowledged', openedDay: '2026-01-12', statistic: -3.25 });
    ids.closed = await insertFlag(t.db, skua, { subject: 'ref:GNSS1', metric: 'sd_m', status: 'closed', openedDay: '2026-01-05', statistic: 3.5 });
    ids.shag = await insertFlag(t.db, shag, { subject: 'vessel', metric: 'hdg_rms', status: 'open', openedDay: '2026-01-10', statistic: 4 });
  });
  afterAll(() => stopApiTest(t));

  it('lists open flags by default, with every field', async () => {
    const body = await jsonOf(await flags());
    expect(body.flags).toEqual([
      {
        id: ids.shag,
        vessel: 'ardle-shag',
        subject: 'vessel',
        metric: 'hdg_rms',
        method: 'mann_kendall',
        severity: 'warning',
        opened_day: '2026-01-10',
        window_from: '2025-12-12',
        window_to: '2026-01-10',
        statistic: 4,
        statistic_name: 'kendall_z',
        explanation: 'Efficiency index falling, "steadily", over 30 days',
        status: 'open',
      },
      expect.objectContaining({ id: ids.open, vessel: 'kelvick-skua', statistic: 2.75 }),
    ]);
    expect(validator.errors('/flags', 200, body)).toEqual([]);
  });

  it('filters by status and vessel, newest first', async () => {
    expect(await idsOf('?status=all')).toEqual([ids.ack, ids.shag, ids.open, ids.closed]);
    expect(await idsOf('?status=acknowledged')).toEqual([ids.ack]);
    expect(await idsOf('?status=closed')).toEqual([ids.closed]);
    expect(await idsOf('?status=all&vessel=kelvick-skua')).toEqual([ids.ack, ids.open, ids.closed]);
    expect(await idsOf('?vessel=ardle-shag')).toEqual([ids.shag]);
  });

  it('answers CSV with the explanation quoted', async () => {
    const response = await flags('?status=acknowledged&format=csv');
    expect(response.headers.get('content-disposition')).toBe('attachment; filename="flags-acknowledged.csv"');
    const text = await response.text();
    expect(text).toContain(',"Efficiency index falling, ""steadily"", over 30 days",acknowledged\r\n');
    expect(parseCsv(text)).toEqual([
      ['id', 'vessel', 'subject', 'metric', 'method', 'severity', 'opened_day', 'window_from', 'window_to', 'statistic', 'statistic_name', 'explanation', 'status'],
      [String(ids.ack), 'kelvick-skua', 'thruster:T1', 'efficiency_index', 'mann_kendall', 'warning', '2026-01-12', '2025-12-14', '2026-01-12', '-3.25', 'kendall_z', 'Efficiency index falling, "steadily", over 30 days', 'acknowledged'],
    ]);
  });

  it('refuses an unknown status (400) and vessel (404)', async () => {
    const bad = await jsonOf(await flags('?status=pending'), 400);
    expect(bad).toEqual({ error: { code: 'invalid_parameter', message: 'status: "pending" is not one of open, acknowledged, closed, all' } });
    expect(validator.errors('/flags', 400, bad)).toEqual([]);
    const missing = await jsonOf(await flags('?vessel=nope'), 404);
    expect(missing).toEqual({ error: { code: 'not_found', message: 'no vessel has the key "nope"' } });
    expect(validator.errors('/flags', 404, missing)).toEqual([]);
  });
});
