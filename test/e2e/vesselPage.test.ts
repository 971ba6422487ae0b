import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { mergeHistograms, radialQuantile } from '../../lib/metrics/radialHistogram';
import { withinPct } from '../../lib/metrics/withinLimit';
import { addDays } from '../../lib/time/fleetDay';
import type { TestBrowser } from '../helpers/browser';
import type { NextServer } from '../helpers/nextServer';
import type { DailyVesselRecord } from './fixtures/dailyFigures';
import type { DemoFleet } from './fixtures/demoFleet';
import { apiJson, hydrated, openDemoSite, screenshot, type DemoSite } from './harness';

/**
 * A vessel page in Chromium: figures over the chosen range, charts with
 * gaps and watch circles, footprint, thrusters, power, references, flags,
 * the range picker. The fleet runs on New Zealand time, so "today" and the
 * day axis are not UTC's (the page must say which zone its days are in).
 */

const TZ = 'Pacific/Auckland';
const en1 = (x: number) => x.toLocaleString('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
const text = async (page: Page, testId: string) => ((await page.getByTestId(testId).textContent()) ?? '').replace(/\s+/g, ' ').trim();

/** Runs of consecutive days present: each is one drawn stretch of line between gaps. */
function runs(days: readonly string[], from: string, to: string): number {
  const present = new Set(days);
  let count = 0;
  let inRun = false;
  for (let d = from; d <= to; d = addDays(d, 1)) {
    if (present.has(d) && !inRun) count++;
    inRun = present.has(d);
  }
  return count;
}

describe('Vessel page in a browser', () => {
  let site: DemoSite;
  let browser: TestBrowser;
  let server: NextServer;
  let demo: DemoFleet;

  beforeAll(async () => {
    // A browser far from the fleet zone: the page must not depend on it.
    site = await openDemoSite({ timeZone: TZ, browserTimeZone: 'America/Santiago' });
    ({ browser, server, demo } = site);
  }, 300_000);
  afterAll(() => site?.close());

  it('shows the last 30 fleet days of real figures, read from the whole range’s samples', async () => {
    const { page, errors } = await browser.newPage();
    const response = await page.goto(`${server.url}/vessels/vardel-tern`);
    expect(response?.status()).toBe(200);
    await hydrated(page);
    expect(await page.getByRole('heading', { level: 1 }).textContent()).toBe('Vardel Tern');
    expect(await text(page, 'range-picker')).toContain(`Fleet days in ${TZ}, both ends included; today is ${demo.today}.`);

    const from = addDays(demo.today, -29);
    const inRange = demo.days['vardel-tern']!.vessel.filter((d) => d.day >= from);
    // DP hours: the same sum the API's daily rows give.
    const api = await apiJson<{ days: DailyVesselRecord[] }>(server, site.token, `/vessels/vardel-tern/daily?from=${from}&to=${demo.today}`);
    expect(api.days.map((d) => d.day)).toEqual(inRange.map((d) => d.day));
    expect(await text(page, 'tile-dp-hours')).toContain(`${en1(api.days.reduce((s, d) => s + d.dp_hours, 0))} h`);
    // p95 and "inside" over the range from the merged histogram (metrics-v1), not an average of days.
    const h = mergeHistograms(inRange.map((d) => d.err_hist));
    expect(await text(page, 'tile-p95')).toContain(`${radialQuantile(h, 0.95)!.m.toFixed(2)} m`);
    expect(await text(page, 'tile-within-3')).toContain(`${withinPct(h, 3)!.toFixed(2)} %`);
    expect(await text(page, 'tile-limit-events')).toContain(String(inRange.reduce((s, d) => s + d.limit_events, 0)));

    // The accuracy chart: drawn, watch circles as reference lines, units and the fleet zone on the axes,
    // and every missing day a gap (the p95 line has one stretch per run of days with figures).
    const accuracy = page.getByTestId('chart-accuracy');
    expect(await accuracy.locator('.recharts-wrapper > svg').count()).toBeGreaterThan(0);
    const svgText = await accuracy.locator('.recharts-wrapper > svg').first().textContent();
    expect(svgText).toContain('Watch circle 3 m');
    expect(svgText).toContain('Watch circle 5 m');
    expect(svgText).toContain('Radial error (m)');
    expect(svgText).toContain(`Fleet day (${TZ})`);
    const p95Path = await accuracy.locator('.recharts-line path.recharts-line-curve').nth(1).getAttribute('d');
    expect(p95Path!.match(/M/g)).toHaveLength(runs(inRange.map((d) => d.day), from, demo.today));
    const gaps = 30 - inRange.length;
    expect(await accuracy.locator('.chart__note').textContent()).toContain(gaps === 0 ? 'Figures on all 30 days.' : `${gaps} of 30 days have no figures`);
    // Wind beside it, with its own unit.
    expect(await page.getByTestId('chart-weather').locator('.recharts-wrapper > svg').first().textContent()).toContain('Speed (m/s)');

    // Footprint: radial distribution of the range, and the track scatter (81 positions: an hour at one per 45 s).
    expect(await page.getByTestId('chart-radial').locator('.recharts-bar-rectangle').count()).toBeGreaterThan(10);
    expect(await page.getByTestId('chart-scatter').locator('.chart__note').textContent()).toMatch(/^81 raw positions/);

    // Thrusters: every registered unit, wear against its interval, and the fouling unit's latest index.
    expect(await page.getByTestId('thruster-row').count()).toBe(6);
    const bt3 = page.locator('[data-testid="thruster-row"][data-unit="BT3"]');
    const lastBt3 = demo.days['vardel-tern']!.thruster.filter((t) => t.unit_id === 'BT3').at(-1)!;
    expect(await bt3.textContent()).toContain(lastBt3.efficiency_index.toFixed(3));
    expect(await bt3.getByTestId('wear-total').textContent()).toMatch(/ of 20,000 h \(\d+ %\)$/);
    expect(await bt3.getByTestId('projected').textContent()).toMatch(/^\d{1,2} [A-Z][a-z]{2} \d{4}$/);
    expect(await page.getByTestId('ref-row').count()).toBe(4);

    // Its flags, and charts for power and references.
    expect(await page.getByTestId('vessel-flag').count()).toBe(1);
    expect(await page.getByTestId('vessel-flag').textContent()).toContain('Thruster efficiency index');
    for (const id of ['normalised', 'heading', 'power-limit', 'power-loss', 'efficiency', 'ref-noise']) {
      expect(await page.getByTestId(`chart-${id}`).locator('.recharts-wrapper > svg').count(), id).toBeGreaterThan(0);
    }

    await screenshot(page, 'vessel-1280');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('changes range with a preset, with dates, and says when a range cannot be shown', async () => {
    const { page, errors } = await browser.newPage();
    await page.goto(`${server.url}/vessels/vardel-tern`);
    await Promise.all([page.waitForURL(/days=7/), page.getByRole('link', { name: '7 days' }).click()]);
    const week = demo.days['vardel-tern']!.vessel.filter((d) => d.day >= addDays(demo.today, -6));
    // A client-side navigation: the new figures replace the old ones a moment after the URL changes.
    await expect.poll(() => page.getByTestId('daily-row').count()).toBe(week.length);
    expect(await page.getByRole('link', { name: '7 days' }).getAttribute('aria-current')).toBe('true');

    const from = addDays(demo.today, -59);
    const to = addDays(demo.today, -40);
    await page.getByLabel('From', { exact: true }).fill(from);
    await page.getByLabel('To', { exact: true }).fill(to);
    await Promise.all([page.waitForURL(/from=/), page.getByRole('button', { name: 'Show' }).click()]);
    const chosen = demo.days['vardel-tern']!.vessel.filter((d) => d.day >= from && d.day <= to);
    await expect.poll(() => page.getByTestId('daily-row').count()).toBe(chosen.length);
    expect(await text(page, 'tile-dp-hours')).toContain(`${en1(chosen.reduce((s, d) => s + d.dp_hours, 0))} h`);
    // No track that far back.
    expect(await page.getByTestId('chart-scatter').getByTestId('chart-empty').textContent()).toContain('no track positions');

    await page.goto(`${server.url}/vessels/vardel-tern?from=2026-02-30`);
    expect(await text(page, 'range-problem')).toContain('could not be read');
    expect(await page.getByRole('link', { name: '30 days' }).getAttribute('aria-current')).toBe('true');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('shows a vessel without figures as empty, not as zeros, and answers 404 for an unknown key', async () => {
    const { page, errors } = await browser.newPage();
    await page.goto(`${server.url}/vessels/fenwick-strand`);
    // The figures stream in under the heading.
    await page.getByTestId('empty-range').waitFor();
    expect(await text(page, 'tile-dp-hours')).toContain('—');
    expect(await text(page, 'tile-p95')).toContain('—');
    expect(await page.getByTestId('chart-accuracy').getByTestId('chart-empty').isVisible()).toBe(true);
    expect(await page.getByTestId('last-seen').textContent()).toContain('never');
    expect(errors).toEqual([]);

    const missing = await page.goto(`${server.url}/vessels/no-such-vessel`);
    expect(missing?.status()).toBe(404);
    expect(await page.getByTestId('not-found').textContent()).toContain('No vessel by that key');
    await page.close();
  });
});
