import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApiToken } from '../../lib/api/tokens';
import { anyFreePort } from '../../lib/net/freePort';
import { launchChromium, type TestBrowser } from '../helpers/browser';
import { createMigratedDatabase, type TestDatabase } from '../helpers/db';
import { startNextServer, type NextServer } from '../helpers/nextServer';
import { screenshot, sharedBuild } from './harness';
import { signInBrowser } from './signIn';

/**
 * The Reception page (is telemetry arriving?) end to end: the shared
 * production build of the web app (test/e2e/harness.ts) served by
 * `next start` against a fresh test database, read by headless Chromium.
 * Also the JSON API over HTTP and the error page when the store is down.
 */

const MIN = 60_000;
const HOUR = 60 * MIN;

const CAUTION =
  "Holdfast is advisory and after the fact. It is not part of any DP control system and not a class or compliance tool; follow your vessel's DP documentation, class rules, industry guidance and licensed practice.";
const RECEPTION = '/reception';

// Whole seconds: the test compares the times the page shows.
const now = new Date(Math.floor(Date.now() / 1000) * 1000);
const ago = (ms: number) => new Date(now.getTime() - ms);

async function countsOf(page: Page, key: string) {
  const row = page.locator(`[data-testid="vessel-row"][data-vessel-key="${key}"]`);
  const read = async (stream: string) => (await row.getByTestId(`count-${stream}`).textContent())?.trim();
  return {
    station: await read('station'),
    thrusters: await read('thrusters'),
    power: await read('power'),
    refs: await read('refs'),
    track: await read('track'),
  };
}

describe('Reception page in a browser', () => {
  let browser: TestBrowser | undefined;
  let db: TestDatabase | undefined;
  let server: NextServer | undefined;
  const extraServers: NextServer[] = [];
  const extraDbs: TestDatabase[] = [];
  let skuaId = 0;

  beforeAll(async () => {
    // First, so that a machine without Chromium fails at once and says why.
    // A browser time zone far from UTC proves the page does not depend on it.
    browser = await launchChromium({ timezoneId: 'Pacific/Chatham' });

    db = await createMigratedDatabase();
    const insertVessel = async (key: string, name: string, type: string, dpClass: number) =>
      (
        await db!.pool.query<{ id: number }>(
          `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg)
           VALUES ($1, $2, $3, $4, '{3,5}', '{3,6}') RETURNING id`,
          [key, name, type, dpClass],
        )
      ).rows[0]!.id;
    skuaId = await insertVessel('kelvick-skua', 'Kelvick Skua', 'PSV', 2);
    const shag = await insertVessel('ardle-shag', 'Ardle Shag', 'CSV', 3);
    await insertVessel('carrow-loon', 'Carrow Loon', 'ROV support', 1);

    const q = (sql: string, params: unknown[]) => db!.pool.query(sql, params);
    // Kelvick Skua: station 3 (+1 outside the window), thrusters 2 (two
    // units at two times), power 1 (two buses at one time), refs 1, track 5.
    for (const t of [ago(1 * MIN), ago(2 * MIN), ago(3 * MIN), ago(30 * HOUR)])
      await q(`INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, $2, 60, 'auto_position', 60, 60)`, [
        skuaId,
        t,
      ]);
    for (const unit of ['T1', 'T2'])
      for (const t of [ago(1 * MIN), ago(2 * MIN)])
        await q(`INSERT INTO ts_thruster (vessel_id, unit_id, t, dt, run_s, starts) VALUES ($1, $2, $3, 60, 60, 0)`, [
          skuaId,
          unit,
          t,
        ]);
    for (const unit of ['B1', 'B2'])
      await q(`INSERT INTO ts_power (vessel_id, unit_id, t, dt) VALUES ($1, $2, $3, 60)`, [skuaId, unit, ago(MIN)]);
    await q(`INSERT INTO ts_ref (vessel_id, unit_id, t, dt) VALUES ($1, 'GNSS1', $2, 60)`, [skuaId, ago(MIN)]);
    for (let i = 1; i <= 5; i++)
      await q(`INSERT INTO ts_track (vessel_id, t, lat, lon) VALUES ($1, $2, 60.1, 5.2)`, [skuaId, ago(i * 10_000)]);

    // Ardle Shag: last heard 40 minutes ago (stale), station 1, thrusters 1
    // (three units at one time), nothing else.
    await q(`INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, $2, 60, 'joystick', 60, 60)`, [
      shag,
      ago(40 * MIN),
    ]);
    for (const unit of ['T1', 'T2', 'T3'])
      await q(`INSERT INTO ts_thruster (vessel_id, unit_id, t, dt, run_s, starts) VALUES ($1, $2, $3, 60, 60, 0)`, [
        shag,
        unit,
        ago(40 * MIN),
      ]);

    // Carrow Loon: registered, never reported.

    await sharedBuild();
    server = await startNextServer({ env: { DATABASE_URL: db.url } });
    await signInBrowser(browser.context, server, db.pool);
  }, 300_000);

  afterAll(async () => {
    await browser?.close();
    for (const s of [server, ...extraServers]) await s?.stop();
    for (const d of [db, ...extraDbs]) await d?.drop();
  });

  it('shows every vessel with its exact 24 h record counts, and new records after the auto-refresh', async () => {
    const { page, errors } = await browser!.newPage();
    const response = await page.goto(server!.url + RECEPTION);
    expect(response?.status()).toBe(200);

    expect(await page.getByRole('banner').getByRole('link', { name: 'Holdfast' }).isVisible()).toBe(true);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Reception');
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Reception' }).getAttribute('aria-current')).toBe('page');
    expect(await page.getByText('All times are UTC.').count()).toBe(1);
    expect((await page.getByTestId('caution').textContent())?.replace(/\s+/g, ' ')).toContain(CAUTION);

    // Rows by name, with their keys.
    const rows = page.getByTestId('vessel-row');
    expect(await rows.evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-vessel-key')))).toEqual([
      'ardle-shag',
      'carrow-loon',
      'kelvick-skua',
    ]);

    expect(await countsOf(page, 'kelvick-skua')).toEqual({
      station: '3',
      thrusters: '2',
      power: '1',
      refs: '1',
      track: '5',
    });
    expect(await countsOf(page, 'ardle-shag')).toEqual({
      station: '1',
      thrusters: '1',
      power: '0',
      refs: '0',
      track: '0',
    });
    expect(await countsOf(page, 'carrow-loon')).toEqual({
      station: '0',
      thrusters: '0',
      power: '0',
      refs: '0',
      track: '0',
    });

    // Last record in UTC with its age; stale after 15 minutes or never.
    const skua = rows.and(page.locator('[data-vessel-key="kelvick-skua"]'));
    const shag = rows.and(page.locator('[data-vessel-key="ardle-shag"]'));
    const carrow = rows.and(page.locator('[data-vessel-key="carrow-loon"]'));
    expect(await skua.locator('time').getAttribute('datetime')).toBe(ago(10_000).toISOString());
    expect(await skua.textContent()).toContain(ago(10_000).toISOString().slice(11, 19));
    expect(await skua.getByTestId('age').textContent()).toMatch(/^\d+ (s|min) ago$/);
    expect(await skua.getByTestId('stale-marker').count()).toBe(0);
    expect(await shag.getByTestId('age').textContent()).toMatch(/^\d+ min ago$/);
    expect(await shag.getByTestId('stale-marker').count()).toBe(1);
    expect(await carrow.textContent()).toContain('No records yet');
    expect(await carrow.getByTestId('stale-marker').count()).toBe(1);

    // Accessible table: a header cell per column and per row.
    expect(await page.locator('thead th[scope="col"]').count()).toBe(9);
    expect(await page.locator('thead th[scope="colgroup"]').count()).toBe(1);
    expect(await page.locator('tbody th[scope="row"]').count()).toBe(3);

    // A new station record shows up after the automatic refresh (every 10 s).
    const updatedBefore = await page.getByTestId('auto-refresh').locator('time').getAttribute('datetime');
    await db!.pool.query(
      `INSERT INTO ts_station (vessel_id, t, dt, mode, dp_s, n) VALUES ($1, $2, 10, 'auto_position', 10, 10)`,
      [skuaId, new Date()],
    );
    await page.locator('[data-vessel-key="kelvick-skua"] [data-testid="count-station"]', { hasText: /^4$/ }).waitFor({
      timeout: 25_000,
    });
    expect((await countsOf(page, 'kelvick-skua')).station).toBe('4');
    expect(await page.getByTestId('auto-refresh').locator('time').getAttribute('datetime')).not.toBe(updatedBefore);

    await screenshot(page, 'reception');
    expect(errors).toEqual([]);
    await page.close();
  }, 60_000);

  it('is usable from the keyboard', async () => {
    const { page, errors } = await browser!.newPage();
    await page.goto(server!.url + RECEPTION);
    // The table streams in after the header: wait for it, or the second Tab finds nothing to stop on.
    await page.locator('[aria-labelledby="fleet-caption"]').waitFor();
    await page.keyboard.press('Tab');
    expect(await page.evaluate(() => document.activeElement?.textContent)).toBe('Skip to content');
    await page.keyboard.press('Enter');
    await page.keyboard.press('Tab');
    // After skipping the header, the table's scroll region is the next stop.
    expect(await page.evaluate(() => document.activeElement?.getAttribute('aria-labelledby'))).toBe('fleet-caption');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('says how to register vessels when the register is empty', async () => {
    const empty = await createMigratedDatabase();
    extraDbs.push(empty);
    const emptyServer = await startNextServer({ env: { DATABASE_URL: empty.url } });
    await signInBrowser(browser!.context, emptyServer, empty.pool);
    extraServers.push(emptyServer);

    const { page, errors } = await browser!.newPage();
    await page.goto(emptyServer.url + RECEPTION);
    expect((await page.getByTestId('empty-state').textContent())?.replace(/\s+/g, ' ').trim()).toBe(
      'No vessels registered yet — import a fleet register with holdfast fleet import FILE',
    );
    expect(await page.getByTestId('vessel-row').count()).toBe(0);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('serves the JSON API over HTTP to a bearer token', async () => {
    const api = `${server!.url}/api/v1`;
    const { token } = await createApiToken(db!.pool, { name: 'e2e', role: 'admin' });
    const unauthorised = await fetch(`${api}/vessels`);
    expect(unauthorised.status).toBe(401);
    expect(await unauthorised.json()).toMatchObject({ error: { code: 'unauthorized' } });

    const response = await fetch(`${api}/vessels`, { headers: { authorization: `Bearer ${token}` } });
    expect(response.status).toBe(200);
    expect(response.headers.get('content-type')).toBe('application/json; charset=utf-8');
    const { vessels } = (await response.json()) as { vessels: { key: string; last_seen: string | null }[] };
    expect(vessels.map((v) => v.key)).toEqual(['ardle-shag', 'carrow-loon', 'kelvick-skua']);
    expect(vessels.find((v) => v.key === 'ardle-shag')!.last_seen).toBe(ago(40 * MIN).toISOString());
    expect(vessels.find((v) => v.key === 'carrow-loon')!.last_seen).toBeNull();

    const csv = await fetch(`${api}/vessels?format=csv`, { headers: { authorization: `Bearer ${token}` } });
    expect((await csv.text()).split('\r\n')[0]).toBe('key,name,type,dp_class,last_seen,open_flags');
    expect((await fetch(`${api}/openapi.json`)).status).toBe(200);
  });

  it('explains the problem when the database is unreachable', async () => {
    // A port nothing listens on.
    const nowhere = `postgres://postgres@127.0.0.1:${await anyFreePort()}/holdfast`;
    const brokenServer = await startNextServer({ env: { DATABASE_URL: nowhere } });
    extraServers.push(brokenServer);

    const { page } = await browser!.newPage();
    await page.goto(brokenServer.url + RECEPTION);
    const problem = page.getByTestId('error-state');
    await problem.waitFor({ timeout: 15_000 });
    expect(await problem.getByRole('heading').textContent()).toBe('The fleet data could not be read');
    expect(await problem.textContent()).toContain('DATABASE_URL');
    expect(await page.getByRole('button', { name: 'Try again' }).isVisible()).toBe(true);
    // The layout, with its caution line, still frames the error.
    expect(await page.getByTestId('caution').isVisible()).toBe(true);
    await page.close();
  });
});
