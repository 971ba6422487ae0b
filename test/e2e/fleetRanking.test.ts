import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { anyFreePort } from '../../lib/net/freePort';
import { addDays } from '../../lib/time/fleetDay';
import type { TestBrowser } from '../helpers/browser';
import { createMigratedDatabase, type TestDatabase } from '../helpers/db';
import type { NextServer } from '../helpers/nextServer';
import type { DemoFleet } from './fixtures/demoFleet';
import { openDemoSite, screenshot, startWeb, type DemoSite } from './harness';
import { signInBrowser } from './signIn';

/**
 * The Fleet page (home): the demo fleet ranked by its health score, in
 * Chromium against the shared production build and a real PostgreSQL.
 * One score is worked out here by hand from the fixture's rows and the
 * formula the page prints, independently of lib/web/healthScore.ts.
 */

/** Open a fleet page and wait for the ranking, which streams in under the heading. */
async function openFleet(page: Page, url: string): Promise<number | undefined> {
  const response = await page.goto(url);
  await page.getByTestId('score-formula').waitFor();
  return response?.status();
}

const rowOf = (page: Page, key: string) => page.locator(`[data-testid="ranking-row"][data-vessel-key="${key}"]`);
const keysInOrder = (page: Page) => page.getByTestId('ranking-row').evaluateAll((trs) => trs.map((tr) => tr.getAttribute('data-vessel-key')));

describe('Fleet ranking in a browser', () => {
  let site: DemoSite;
  let browser: TestBrowser;
  let server: NextServer;
  let demo: DemoFleet;
  const extraServers: NextServer[] = [];
  const extraDbs: TestDatabase[] = [];

  beforeAll(async () => {
    // A browser time zone far from UTC proves the page does not depend on it.
    site = await openDemoSite({ browserTimeZone: 'Pacific/Chatham' });
    ({ browser, server, demo } = site);
  }, 300_000);

  afterAll(async () => {
    for (const s of extraServers) await s.stop();
    for (const d of extraDbs) await d.drop();
    await site?.close();
  });

  it('ranks every vessel by its health score and shows the formula', async () => {
    const { page, errors } = await browser.newPage();
    expect(await openFleet(page, server.url)).toBe(200);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Fleet');
    expect(await page.getByText('Days are fleet days in UTC.').count()).toBe(1);
    expect(await page.getByTestId('ranking-row').count()).toBe(12);

    // Ranked by score, highest first; the vessel that never reported has no score and comes last.
    const scores = await page.getByTestId('score').allTextContents();
    const numeric = scores.filter((s) => s !== '—').map(Number);
    expect(numeric).toEqual([...numeric].sort((a, b) => b - a));
    expect(scores.at(-1)).toBe('—');
    expect((await keysInOrder(page)).at(-1)).toBe('fenwick-strand');
    expect(await rowOf(page, 'fenwick-strand').textContent()).toContain('No DP data');

    // The degrading vessel with an alarm flag is the lowest scored, and says so in words.
    const scored = (await keysInOrder(page)).slice(0, -1);
    expect(scored.at(-1)).toBe('haldrun-kite');
    expect(await rowOf(page, 'haldrun-kite').textContent()).toContain('Needs a look');
    expect(await rowOf(page, 'haldrun-kite').getByTestId('open-flags').textContent()).toContain('1 alarm');

    // corvath-pioneer by hand: 30-day window, weights 40/20/25/15 as printed on the page.
    const window = demo.days['corvath-pioneer']!.vessel.filter((d) => d.day >= addDays(demo.today, -29));
    const norms = window.flatMap((d) => (d.p95_norm === null ? [] : [d.p95_norm])).sort((a, b) => a - b);
    const mid = norms.length >> 1;
    const median = norms.length % 2 ? norms[mid]! : (norms[mid - 1]! + norms[mid]!) / 2;
    const rate = (window.reduce((s, d) => s + d.limit_events, 0) * 24) / window.reduce((s, d) => s + d.dp_hours, 0);
    const clamp = (x: number) => Math.min(1, Math.max(0, x));
    const lost = 40 * clamp((median - 1) / 0.5) + 20 * clamp(rate / 4) + 25 * clamp(1 / 6) + 15 * 0;
    expect(await rowOf(page, 'corvath-pioneer').getByTestId('score').textContent()).toBe(String(Math.round(100 - lost)));
    expect(await rowOf(page, 'corvath-pioneer').getByTestId('limit-rate').textContent()).toBe(rate.toFixed(1));

    const formula = page.getByTestId('score-formula');
    expect(await formula.textContent()).toContain('Score = 100 × (1 − points lost ÷ weights counted)');
    expect(await formula.locator('tbody tr').evaluateAll((trs) => trs.map((tr) => tr.children[1]!.textContent))).toEqual(['40', '20', '25', '15']);

    // Thrusters near their service interval count against the score.
    expect(await rowOf(page, 'gorran-halcyon').getByTestId('thrusters-due').textContent()).toBe('1 of 5');
    expect(await rowOf(page, 'vardel-tern').getByTestId('thrusters-due').textContent()).toBe('0 of 6');

    // A 30-day trend line per vessel, and the latest daily p95 beside it.
    expect(await rowOf(page, 'vardel-tern').locator('svg.spark path').count()).toBe(1);
    const latest = demo.days['vardel-tern']!.vessel.at(-1)!;
    expect(await rowOf(page, 'vardel-tern').getByTestId('latest-p95').textContent()).toContain(`${latest.p95_m!.toFixed(2)} m`);
    expect(await rowOf(page, 'fenwick-strand').getByTestId('latest-p95').textContent()).toBe('no figures');

    // At 1280 px every column fits: the table does not need to scroll sideways.
    const tableOverflow = await page.locator('[role="region"][aria-labelledby="ranking-caption"]').evaluate((el) => el.scrollWidth - el.clientWidth);
    expect(tableOverflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'fleet-1280');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('marks stale vessels with their last-seen age', async () => {
    const { page } = await browser.newPage();
    await openFleet(page, server.url);
    expect(await rowOf(page, 'vardel-tern').getByTestId('age').textContent()).toMatch(/^\d+ (s|min) ago$/);
    expect(await rowOf(page, 'vardel-tern').getByTestId('stale-marker').count()).toBe(0);
    expect(await rowOf(page, 'ellisk-dawn').getByTestId('age').textContent()).toMatch(/^3 d ago$/);
    expect(await rowOf(page, 'ellisk-dawn').getByTestId('stale-marker').count()).toBe(1);
    expect(await rowOf(page, 'fenwick-strand').textContent()).toContain('never');
    expect(await rowOf(page, 'fenwick-strand').getByTestId('stale-marker').count()).toBe(1);
    expect(await page.getByTestId('summary').textContent()).toContain('2 stale');
    await page.close();
  });

  it('sorts from the keyboard and filters by type, DP class and campaign', async () => {
    const { page, errors } = await browser.newPage();
    await openFleet(page, server.url);
    // Tab through the page until the "Open flags" sort link has focus, then press Enter.
    let reached = false;
    for (let i = 0; i < 40 && !reached; i++) {
      await page.keyboard.press('Tab');
      reached = await page.evaluate(() => document.activeElement?.getAttribute('data-testid') === 'sort-flags');
    }
    expect(reached).toBe(true);
    await Promise.all([page.waitForURL(/sort=flags/), page.keyboard.press('Enter')]);
    await page.getByTestId('ranking-row').first().waitFor();
    expect(await page.locator('th[aria-sort="descending"]').textContent()).toContain('Open flags');
    const flagCounts = (await page.getByTestId('open-flags').allTextContents()).map((t) => Number.parseInt(t, 10));
    expect(flagCounts).toEqual([...flagCounts].sort((a, b) => b - a));
    expect(flagCounts.filter((n) => n > 0)).toHaveLength(5);

    await page.getByLabel('Type', { exact: true }).selectOption('drilling');
    await Promise.all([page.waitForURL(/type=drilling/), page.getByRole('button', { name: 'Apply' }).click()]);
    await page.getByTestId('score-formula').waitFor();
    expect((await keysInOrder(page)).sort()).toEqual(['brisen-aurora', 'corvath-pioneer', 'tollan-spire']);
    // The chosen order survives filtering.
    expect(page.url()).toContain('sort=flags');

    await openFleet(page, `${server.url}/?class=3`);
    const dp3 = demo.file.vessels.filter((v) => v.dp_class === 3).map((v) => v.key).sort();
    expect((await keysInOrder(page)).sort()).toEqual(dp3);

    await openFleet(page, `${server.url}/?campaign=${demo.campaigns.tarnholm}`);
    expect((await keysInOrder(page)).sort()).toEqual(['mirrick-swift', 'osk-meridian', 'vardel-tern']);
    expect(await page.getByTestId('summary').textContent()).toContain('3 match the filters');

    await openFleet(page, `${server.url}/?type=nothing-like-this`);
    expect(await page.getByTestId('no-match').isVisible()).toBe(true);
    expect(errors).toEqual([]);
    await page.close();
  });

  it('is readable on a tablet: nothing but the table scrolls sideways', async () => {
    const { page } = await browser.newPage();
    await page.setViewportSize({ width: 820, height: 1180 });
    await openFleet(page, server.url);
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).toBeLessThanOrEqual(0);
    await screenshot(page, 'fleet-tablet');
    await page.close();
  });

  it('says how to register vessels when the register is empty, and explains a database that cannot be read', async () => {
    const empty = await createMigratedDatabase();
    extraDbs.push(empty);
    const emptyServer = await startWeb(empty.url);
    extraServers.push(emptyServer);
    await signInBrowser(browser.context, emptyServer, empty.pool);
    const brokenServer = await startWeb(`postgres://postgres@127.0.0.1:${await anyFreePort()}/holdfast`);
    extraServers.push(brokenServer);

    const { page } = await browser.newPage();
    await page.goto(emptyServer.url);
    await page.getByTestId('empty-state').waitFor();
    expect(await page.getByTestId('empty-state').textContent()).toContain('No vessels registered yet');
    await page.goto(brokenServer.url);
    await page.getByTestId('error-state').waitFor({ timeout: 15_000 });
    expect(await page.getByTestId('caution').isVisible()).toBe(true);
    await page.close();
  });
});
