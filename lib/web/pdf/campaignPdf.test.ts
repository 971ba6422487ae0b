import { describe, expect, it } from 'vitest';
import type { CampaignReport } from '../../api/queries/campaignReport';
import { campaignPdf } from './campaignPdf';
import { readPdf } from './pdfText';

const report = (vessels: number): CampaignReport => ({
  campaign: {
    key: 'tarnholm-tieback-2026',
    charterer: 'Aldmoor Energy',
    from: '2026-10-01',
    to: '2027-01-31',
    site: { name: 'Tarnholm Field', lat: 59.412, lon: -2.871 },
    watch_circles_m: [3, 5],
  },
  as_of: '2026-12-02',
  period: { from: '2026-10-01', to: '2026-12-02' },
  vessels: Array.from({ length: vessels }, (_, i) => ({
    vessel: `vessel-${i}`,
    name: i === 0 ? 'Vardel Tern' : `Vessel ${i}`,
    days_computed: 60,
    dp_hours: 1234.56,
    p95_m: i === 1 ? 10 : 3.0912,
    p95_overflow: i === 1,
    within_pct: { '3': 94.44, '5': null },
    limit_events: i === 0 ? 0 : 7,
    blackouts: null,
  })),
});

const generatedAt = new Date('2026-12-02T08:00:00Z');

describe('campaign PDF', () => {
  it('holds the campaign, the table as the page shows it, the definitions and the cautions', () => {
    const { pages } = readPdf(campaignPdf({ report: report(2), timeZone: 'Europe/Oslo', generatedAt }));
    expect(pages).toHaveLength(1);
    const text = pages[0]!;
    expect(text).toContain('Campaign tarnholm-tieback-2026');
    expect(text).toContain('Aldmoor Energy');
    expect(text).toContain('Tarnholm Field (59.412° N, 2.871° W)');
    expect(text).toContain('1 Oct 2026 to 31 Jan 2027');
    expect(text).toContain('Fleet days in Europe/Oslo');
    // The first vessel's row: name, key, then the cells in column order.
    const row = text.indexOf('Vardel Tern');
    expect(text.slice(row, row + 9)).toEqual(['Vardel Tern', 'vessel-0', '60', '1,234.6 h', '3.09 m', '94.4 %', '—', '0', '—']);
    // The overflow bin, spelled for the standard font.
    expect(text).toContain('>= 10 m');
    expect(text.join(' ')).toContain('Not part of any DP control system');
    expect(text.join(' ')).toContain('licensed practice');
    expect(text).toContain('Page 1 of 1');
  });

  it('continues a long table on further pages with the header repeated', () => {
    const { pages } = readPdf(campaignPdf({ report: report(40), timeZone: 'UTC', generatedAt }));
    expect(pages.length).toBeGreaterThan(1);
    for (const p of pages.slice(0, -1)) expect(p).toContain('Vessel');
    expect(pages.flat().filter((t) => /^vessel-\d+$/.test(t))).toHaveLength(40);
    expect(pages.at(-1)).toContain(`Page ${pages.length} of ${pages.length}`);
  });
});
