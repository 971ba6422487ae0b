import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TestBrowser } from '../helpers/browser';
import type { NextServer } from '../helpers/nextServer';
import { demoFleetFile, type DemoFleet } from './fixtures/demoFleet';
import { hydrated, openDemoSite, screenshot, type DemoSite } from './harness';

/**
 * Admin in Chromium: a fleet register file checked, its differences shown
 * field by field, imported, and checked again (nothing left to change); a
 * file with errors refused with every error by path; webhooks and access
 * pages.
 */

describe('Admin in a browser', () => {
  let site: DemoSite;
  let browser: TestBrowser;
  let server: NextServer;
  let demo: DemoFleet;

  beforeAll(async () => {
    site = await openDemoSite();
    ({ browser, server, demo } = site);
  }, 300_000);
  afterAll(() => site?.close());

  it('checks a register file, shows what changes, imports it, and finds nothing left to change', async () => {
    const changed = JSON.parse(JSON.stringify(demoFleetFile(demo.today)));
    changed.vessels[0].name = 'Vardel Tern II';
    changed.vessels[0].thrusters[2].service_interval_h = 25000;
    changed.vessels.push({ ...changed.vessels[1], key: 'osk-horizon', name: 'Osk Horizon' });
    const text = JSON.stringify(changed, null, 2);

    const { page, errors } = await browser.newPage();
    await page.goto(`${server.url}/admin`);
    await page.getByRole('link', { name: 'Fleet register' }).click();
    await hydrated(page);
    await page.getByTestId('register-file').setInputFiles({ name: 'fleet.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    await page.getByRole('button', { name: 'Check file' }).click();
    const preview = page.getByTestId('register-preview');
    await preview.waitFor({ timeout: 15_000 });
    expect(await preview.textContent()).toContain('Vessels: 1 new, 1 changed, 11 unchanged');
    const vardel = preview.locator('[data-testid="diff-item"][data-key="vardel-tern"]');
    expect(await vardel.getAttribute('data-status')).toBe('updated');
    expect(await vardel.locator('[data-path="name"]').textContent()).toBe('nameVardel TernVardel Tern II');
    expect(await vardel.locator('[data-path="thrusters.BT3.service_interval_h"]').textContent()).toBe('thrusters.BT3.service_interval_h2000025000');
    expect(await preview.locator('[data-testid="diff-item"][data-key="osk-horizon"]').getAttribute('data-status')).toBe('created');
    // Nothing is written by a check.
    expect((await site.db.pool.query(`SELECT name FROM vessel WHERE key = 'vardel-tern'`)).rows[0].name).toBe('Vardel Tern');
    await screenshot(page, 'admin-register-preview');

    await preview.getByRole('button', { name: 'Import these changes' }).click();
    await page.getByTestId('register-imported').waitFor({ timeout: 30_000 });
    expect((await site.db.pool.query(`SELECT name FROM vessel WHERE key = 'vardel-tern'`)).rows[0].name).toBe('Vardel Tern II');
    expect(
      (await site.db.pool.query(`SELECT t.service_interval_h FROM thruster t JOIN vessel v ON v.id = t.vessel_id WHERE v.key = 'vardel-tern' AND t.unit_id = 'BT3'`)).rows[0]
        .service_interval_h,
    ).toBe(25000);
    expect((await site.db.pool.query(`SELECT count(*)::int AS n FROM vessel`)).rows[0].n).toBe(13);

    // The same file again: nothing to change.
    await page.getByTestId('register-file').setInputFiles({ name: 'fleet.json', mimeType: 'application/json', buffer: Buffer.from(text) });
    await page.getByRole('button', { name: 'Check file' }).click();
    await page.getByTestId('register-preview').getByText('Vessels: 0 new, 0 changed, 13 unchanged').waitFor({ timeout: 15_000 });
    expect(errors).toEqual([]);
    await page.close();
  });

  it('refuses a file with errors, listing every one by path, and changes nothing', async () => {
    const bad = JSON.parse(JSON.stringify(demoFleetFile(demo.today)));
    bad.vessels[3].thrusters[1].rated_kw = -5;
    bad.vessels[4].dp_class = 4;
    const { page } = await browser.newPage();
    await page.goto(`${server.url}/admin/register`);
    await hydrated(page);
    await page.getByTestId('register-file').setInputFiles({ name: 'fleet.json', mimeType: 'application/json', buffer: Buffer.from(JSON.stringify(bad)) });
    await page.getByRole('button', { name: 'Check file' }).click();
    const problems = page.getByTestId('register-errors');
    await problems.waitFor({ timeout: 15_000 });
    const listed = await problems.locator('li').allTextContents();
    expect(listed).toContain('vessels[3].thrusters[1].rated_kw: must be > 0');
    expect(listed).toContain('vessels[4].dp_class: must be 1, 2 or 3');
    expect(await page.getByTestId('register-preview').count()).toBe(0);
    await page.close();
  });

  it('lists campaigns, webhooks (the address without its query string, never the secret) and access', async () => {
    const { page, errors } = await browser.newPage();
    await page.goto(`${server.url}/admin/campaigns`);
    expect(await page.getByTestId('admin-campaigns').locator('tbody tr').count()).toBe(2);
    await page.goto(`${server.url}/admin/webhooks`);
    expect(await page.getByTestId('webhooks-empty').textContent()).toContain('No webhooks configured');
    await site.db.pool.query(`INSERT INTO flag_webhook (url, secret) VALUES ('https://hooks.example/holdfast?token=abc', 's3cret')`);
    await page.reload();
    const hook = page.getByTestId('webhook-row');
    // The address without its query string (it may carry a token), never the secret.
    expect(await hook.textContent()).toContain('https://hooks.example/holdfast?…');
    expect(await hook.textContent()).not.toContain('abc');
    expect(await hook.textContent()).not.toContain('s3cret');
    await page.goto(`${server.url}/admin/access`);
    expect(await page.getByTestId('users').textContent()).toContain(site.user.email);
    expect(await page.getByTestId('tokens').textContent()).toContain('browser tests');
    await screenshot(page, 'admin-access');
    expect(errors).toEqual([]);
    await page.close();
  });
});
