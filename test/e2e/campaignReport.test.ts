import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { CampaignReport } from '../../lib/api/queries/campaignReport';
import { readPdf } from '../../lib/web/pdf/pdfText';
import type { TestBrowser } from '../helpers/browser';
import type { NextServer } from '../helpers/nextServer';
import type { DemoFleet } from './fixtures/demoFleet';
import { apiJson, hydrated, openDemoSite, screenshot, type DemoSite } from './harness';

/**
 * The charterer's campaign report in Chromium: the page's figures, the CSV
 * and the PDF downloaded through the browser, each checked against the
 * JSON API's answer for the same campaign; the print stylesheet; the
 * cautions.
 */

const dash = (v: number | null, f: (x: number) => string) => (v === null ? '—' : f(v));
const hoursText = (x: number) => `${x.toLocaleString('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 1 })} h`;
const pctText = (x: number) => `${x.toFixed(1)} %`;

/** The cells a vessel's row must show, written from the API's numbers. */
function expectedCells(v: CampaignReport['vessels'][number], limits: number[]): string[] {
  return [
    String(v.days_computed),
    dash(v.dp_hours, hoursText),
    v.p95_overflow ? '≥ 10 m' : dash(v.p95_m, (x) => `${x.toFixed(2)} m`),
    ...limits.map((l) => dash(v.within_pct[String(l)] ?? null, pctText)),
    dash(v.limit_events, String),
    dash(v.blackouts, String),
  ];
}

describe('Campaign report in a browser', () => {
  let site: DemoSite;
  let browser: TestBrowser;
  let server: NextServer;
  let demo: DemoFleet;
  let api: CampaignReport;

  beforeAll(async () => {
    site = await openDemoSite();
    ({ browser, server, demo } = site);
    api = await apiJson<CampaignReport>(server, site.token, `/campaigns/${demo.campaigns.tarnholm}/report`);
  }, 300_000);
  afterAll(() => site?.close());

  it('lists the campaigns and shows one report with the API’s figures', async () => {
    const { page, errors } = await browser.newPage();
    await page.goto(`${server.url}/campaigns`);
    expect(await page.getByTestId('campaign-row').count()).toBe(2);
    await Promise.all([page.waitForURL(/\/campaigns\/tarnholm/), page.getByRole('link', { name: demo.campaigns.tarnholm }).click()]);
    await hydrated(page);

    const facts = (await page.getByTestId('campaign-facts').textContent())!;
    expect(facts).toContain('Aldmoor Energy');
    expect(facts).toContain('Tarnholm Field (59.412° N, 2.871° E)');
    expect(facts).toContain('3 m, 5 m');
    expect(api.vessels.map((v) => v.vessel)).toEqual(['mirrick-swift', 'osk-meridian', 'vardel-tern']);
    for (const v of api.vessels) {
      const cells = await page.locator(`[data-testid="campaign-vessel"][data-vessel-key="${v.vessel}"] td`).allTextContents();
      expect(cells, v.vessel).toEqual(expectedCells(v, api.campaign.watch_circles_m));
    }
    expect(await page.getByTestId('chart-campaign-bars').locator('.recharts-wrapper > svg').count()).toBeGreaterThan(0);
    const caution = (await page.getByTestId('report-caution').textContent())!;
    expect(caution).toContain('Not part of any DP control system');
    expect(caution).toContain('Not a class or compliance record');
    expect(caution).toContain('licensed practice');

    await screenshot(page, 'campaign-1280');
    // On paper: no navigation, no buttons; the cautions stay.
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('.site-header').isVisible()).toBe(false);
    expect(await page.getByTestId('download-pdf').isVisible()).toBe(false);
    expect(await page.getByTestId('report-caution').isVisible()).toBe(true);
    await screenshot(page, 'campaign-print');
    expect(errors).toEqual([]);
    await page.close();
  });

  it('downloads the CSV the API gives, byte for byte', async () => {
    const { page } = await browser.newPage();
    await page.goto(`${server.url}/campaigns/${demo.campaigns.tarnholm}`);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('download-csv').click()]);
    expect(download.suggestedFilename()).toBe(`campaign-${demo.campaigns.tarnholm}-${api.as_of}.csv`);
    const csv = readFileSync((await download.path())!, 'utf8');
    const fromApi = await (
      await fetch(`${server.url}/api/v1/campaigns/${demo.campaigns.tarnholm}/report?format=csv`, { headers: { authorization: `Bearer ${site.token}` } })
    ).text();
    expect(csv).toBe(fromApi);
    const [header, ...rows] = csv.trimEnd().split('\r\n');
    expect(header).toBe('vessel,name,days_computed,dp_hours,p95_m,p95_overflow,within_pct_3,within_pct_5,limit_events,blackouts');
    expect(rows.map((r) => Number(r.split(',')[3]))).toEqual(api.vessels.map((v) => v.dp_hours));
    await page.close();
  });

  it('downloads a PDF with the same figures, the period and the cautions', async () => {
    const { page } = await browser.newPage();
    await page.goto(`${server.url}/campaigns/${demo.campaigns.tarnholm}`);
    const [download] = await Promise.all([page.waitForEvent('download'), page.getByTestId('download-pdf').click()]);
    expect(download.suggestedFilename()).toBe(`campaign-${demo.campaigns.tarnholm}-${api.as_of}.pdf`);
    const file = readFileSync((await download.path())!);
    expect(file.subarray(0, 8).toString('latin1')).toBe('%PDF-1.4');
    const { pages } = readPdf(file);
    const lines = pages.flat();
    for (const v of api.vessels) {
      const at = lines.indexOf(v.vessel);
      expect(at, v.vessel).toBeGreaterThan(0);
      // The standard PDF fonts have no "≥": the PDF spells it ">=".
      expect(lines.slice(at + 1, at + 8), v.vessel).toEqual(expectedCells(v, api.campaign.watch_circles_m).map((c) => c.replace('≥', '>=')));
    }
    expect(lines).toContain('Aldmoor Energy');
    expect(lines.join(' ')).toContain('Not part of any DP control system');
    expect(lines).toContain('Fleet days in UTC');
    await page.close();
  });

  it('reports a campaign that has not started as empty, and answers 404 for an unknown one', async () => {
    await site.db.pool.query(`UPDATE campaign SET from_day = current_date + 5, to_day = current_date + 50 WHERE key = $1`, [demo.campaigns.skerrin]);
    const { page } = await browser.newPage();
    await page.goto(`${server.url}/campaigns/${demo.campaigns.skerrin}`);
    expect(await page.getByTestId('report-period').textContent()).toBe('Not started: no days yet');
    const cells = await page.getByTestId('campaign-vessel').first().locator('td').allTextContents();
    expect(cells).toEqual(['0', '—', '—', '—', '—', '—', '—']);
    expect((await page.goto(`${server.url}/campaigns/no-such-campaign`))?.status()).toBe(404);
    expect((await fetch(`${server.url}/campaigns/no-such-campaign/report.pdf`, { headers: { cookie: site.user.cookie } })).status).toBe(404);
    await page.close();
  });
});
