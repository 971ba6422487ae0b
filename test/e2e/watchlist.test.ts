import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { TestBrowser } from '../helpers/browser';
import type { NextServer } from '../helpers/nextServer';
import type { DemoFleet } from './fixtures/demoFleet';
import { apiJson, hydrated, openDemoSite, screenshot, type DemoSite } from './harness';

/**
 * The shore watchlist in Chromium: open and acknowledged flags, most severe
 * first, each with its chart and window; a flag acknowledged and then closed
 * with notes through the page, checked in the store and through the API.
 */

const card = (page: Page, id: number) => page.locator(`[data-testid="flag-card"][data-flag-id="${id}"]`);
const cardIds = (page: Page) => page.getByTestId('flag-card').evaluateAll((els) => els.map((e) => Number(e.getAttribute('data-flag-id'))));

describe('Watchlist in a browser', () => {
  let site: DemoSite;
  let browser: TestBrowser;
  let server: NextServer;
  let demo: DemoFleet;

  beforeAll(async () => {
    site = await openDemoSite();
    ({ browser, server, demo } = site);
  }, 300_000);
  afterAll(() => site?.close());

  it('lists open and acknowledged flags, most severe then newest first, each with its chart and window', async () => {
    const { page, errors } = await browser.newPage();
    expect((await page.goto(`${server.url}/watchlist`))?.status()).toBe(200);
    await hydrated(page);
    const f = demo.flags;
    // alarm; warnings opened 4 and 9 days ago; advisories opened 6 and 15 days ago. The closed one is not listed.
    expect(await cardIds(page)).toEqual([f.degrading, f.fouling, f.noisyRef, f.powerLimit, f.clearing]);
    expect(await page.getByTestId('watchlist-summary').textContent()).toContain('5 flags open and acknowledged');

    const fouling = card(page, f.fouling);
    expect(await fouling.textContent()).toContain('Vardel Tern · Thruster BT3 · Thruster efficiency index');
    expect(await fouling.getByTestId('flag-explanation').textContent()).toContain('Mann–Kendall p = 0.002');
    // The watched series, with the flag's window shaded and named, and the metric's unit on the axis.
    const svg = fouling.locator('.recharts-wrapper > svg').first();
    await svg.waitFor();
    expect(await svg.textContent()).toContain('Flag window');
    expect(await svg.textContent()).toContain('Thrust per power^⅔ (kN/kW^⅔)');
    expect(await fouling.locator('.recharts-reference-area').count()).toBe(1);
    expect(await card(page, f.noisyRef).getByTestId('flag-record').textContent()).toContain('Acknowledged by Ines Okafor');
    expect(await card(page, f.clearing).getByTestId('clearing').textContent()).toContain('proposes closing this flag');
    await fouling.getByText('The test’s figures').or(fouling.getByText("The test's figures")).click();
    expect(await fouling.getByTestId('flag-evidence').textContent()).toContain('sen slope per day');

    await screenshot(page, 'watchlist-1280');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('acknowledges a flag and then closes it, each with a note', async () => {
    const { page, errors } = await browser.newPage();
    await page.goto(`${server.url}/watchlist#flag-${demo.flags.fouling}`);
    await hydrated(page);
    const fouling = card(page, demo.flags.fouling);
    const ack = fouling.getByTestId('acknowledge-form');
    await ack.getByLabel('Note').fill('Diver inspection of the BT3 tunnel booked for Friday.');
    await ack.getByRole('button', { name: 'Acknowledge' }).click();
    await fouling.getByTestId('flag-status').filter({ hasText: 'acknowledged' }).waitFor({ timeout: 15_000 });
    // Recorded under the signed-in user's address, not a typed name.
    expect(await fouling.getByTestId('flag-record').textContent()).toContain(`Acknowledged by ${site.user.email}`);
    expect(await fouling.getByTestId('acknowledge-form').count()).toBe(0);

    const { rows: acked } = await site.db.pool.query(
      'SELECT status, acknowledged_by, acknowledge_note, acknowledged_at FROM flag WHERE id = $1',
      [demo.flags.fouling],
    );
    expect(acked[0]).toMatchObject({ status: 'acknowledged', acknowledged_by: site.user.email, acknowledge_note: 'Diver inspection of the BT3 tunnel booked for Friday.' });
    expect(Date.now() - acked[0].acknowledged_at.getTime()).toBeLessThan(60_000);
    const viaApi = await apiJson<{ flags: { id: number; status: string }[] }>(server, site.token, '/flags?status=acknowledged');
    expect(viaApi.flags.map((x) => x.id)).toContain(demo.flags.fouling);

    // Close it as resolved.
    const close = fouling.getByTestId('close-form');
    await close.getByLabel('Resolved').check();
    await close.getByLabel('Note').fill('Tunnel cleaned; efficiency back to 0.92.');
    await close.getByRole('button', { name: 'Close flag' }).click();
    // Closed flags leave the default view.
    await fouling.waitFor({ state: 'detached', timeout: 15_000 });
    const { rows: closed } = await site.db.pool.query('SELECT status, close_reason, closed_by, close_note FROM flag WHERE id = $1', [demo.flags.fouling]);
    expect(closed[0]).toEqual({ status: 'closed', close_reason: 'resolved', closed_by: site.user.email, close_note: 'Tunnel cleaned; efficiency back to 0.92.' });

    await page.goto(`${server.url}/watchlist?status=closed`);
    const record = await card(page, demo.flags.fouling).getByTestId('flag-record').textContent();
    expect(record).toContain(`Acknowledged by ${site.user.email}`);
    expect(record).toContain(`Closed as resolved by ${site.user.email}`);
    // Both steps are in the audit log, under the user who took them.
    const { rows: audit } = await site.db.pool.query(`SELECT action, actor FROM audit_log WHERE subject = $1 ORDER BY id`, [`flag ${demo.flags.fouling}`]);
    expect(audit).toEqual([
      { action: 'flag.acknowledge', actor: site.user.email },
      { action: 'flag.close', actor: site.user.email },
    ]);
    expect(await card(page, demo.flags.fouling).getByTestId('close-form').count()).toBe(0);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('filters by vessel, subject and metric, and says when nothing matches', async () => {
    const { page } = await browser.newPage();
    await page.goto(`${server.url}/watchlist`);
    await page.getByLabel('Vessel', { exact: true }).selectOption('osk-meridian');
    await Promise.all([page.waitForURL(/vessel=osk-meridian/), page.getByRole('button', { name: 'Apply' }).click()]);
    await expect.poll(() => cardIds(page)).toEqual([demo.flags.noisyRef]);

    await page.goto(`${server.url}/watchlist?subject=ref`);
    expect((await cardIds(page)).sort()).toEqual([demo.flags.noisyRef, demo.flags.clearing].sort());
    await page.goto(`${server.url}/watchlist?metric=limit_events_per_dp_day`);
    expect(await cardIds(page)).toEqual([demo.flags.powerLimit]);
    await page.goto(`${server.url}/watchlist?order=newest`);
    expect((await cardIds(page))[0]).toBe(demo.flags.degrading);
    await page.goto(`${server.url}/watchlist?vessel=fenwick-strand`);
    expect(await page.getByTestId('empty-state').textContent()).toContain('No flag matches these filters.');
    await page.close();
  }, 90_000);
});
