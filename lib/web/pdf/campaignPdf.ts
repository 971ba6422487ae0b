import type { CampaignReport } from '../../api/queries/campaignReport';
import { longDay } from '../../charts/days';
import { CAUTION_REPORT } from '../cautions';
import { campaignTable, coordinate } from '../campaignTable';
import { PdfDocument, type PdfPage, type Rgb } from './pdfDocument';
import { textWidth, wrapText } from './winAnsi';

/**
 * The campaign report as an A4 PDF for the charterer: campaign, period,
 * per-vessel table (repeated header on every page), what each column means,
 * the cautions, and on each page the fleet time zone and page number.
 */

const MARGIN = 48;
const INK: Rgb = [0.09, 0.13, 0.16];
const MUTED: Rgb = [0.36, 0.4, 0.45];
const RULE: Rgb = [0.8, 0.83, 0.85];
const BAND: Rgb = [0.08, 0.23, 0.28];
const SHADE: Rgb = [0.95, 0.96, 0.95];
const CAUTION_FILL: Rgb = [0.99, 0.95, 0.87];
const CAUTION_RULE: Rgb = [0.85, 0.67, 0.35];

const ROW_H = 26;
const HEAD_H = 30;

export interface CampaignPdfInput {
  report: CampaignReport;
  timeZone: string;
  generatedAt: Date;
}

function paragraph(page: PdfPage, x: number, top: number, width: number, text: string, size: number, color: Rgb = INK): number {
  let y = top;
  for (const line of wrapText(text, width, size)) {
    page.text(x, y, line, { size, color });
    y += size * 1.35;
  }
  return y;
}

export function campaignPdf({ report, timeZone, generatedAt }: CampaignPdfInput): Buffer {
  const c = report.campaign;
  const doc = new PdfDocument({
    title: `Station-keeping report: ${c.key}`,
    subject: `${c.charterer}, ${c.site.name}, ${c.from} to ${c.to}`,
    created: generatedAt,
  });
  const table = campaignTable(report);
  const contentWidth = 595.28 - 2 * MARGIN;
  const vesselWidth = 150;
  const colWidth = (contentWidth - vesselWidth) / table.columns.length;

  const pages: PdfPage[] = [];
  const newPage = () => {
    const page = doc.addPage();
    pages.push(page);
    page.rect(0, 0, page.width, 34, { fill: BAND });
    page.text(MARGIN, 22, 'Holdfast', { font: 'bold', size: 11, color: [1, 1, 1] });
    page.text(page.width - MARGIN, 22, 'Station-keeping report', { size: 9, color: [0.85, 0.9, 0.92], align: 'right' });
    return page;
  };

  let page = newPage();
  let y = 72;
  page.text(MARGIN, y, `Campaign ${c.key}`, { font: 'bold', size: 18, color: INK });
  y += 24;
  const facts: [string, string][] = [
    ['Charterer', c.charterer],
    ['Site', `${c.site.name} (${coordinate(c.site.lat, 'N', 'S')}, ${coordinate(c.site.lon, 'E', 'W')})`],
    ['Campaign dates', `${longDay(c.from)} to ${longDay(c.to)}`],
    ['Period in this report', report.period ? `${longDay(report.period.from)} to ${longDay(report.period.to)} (as of ${report.as_of})` : 'Not started: no days yet'],
    ['Watch circles', c.watch_circles_m.map((l) => `${l} m`).join(', ')],
    ['Days', `Fleet days in ${timeZone}`],
  ];
  for (const [label, value] of facts) {
    page.text(MARGIN, y, label, { size: 9, color: MUTED });
    page.text(MARGIN + 120, y, value, { size: 10, color: INK });
    y += 15;
  }
  y += 14;

  const header = (p: PdfPage, top: number) => {
    p.rect(MARGIN, top, contentWidth, HEAD_H, { fill: SHADE });
    p.text(MARGIN + 6, top + 18, 'Vessel', { font: 'bold', size: 8.5, color: INK });
    table.columns.forEach((col, i) => {
      const right = MARGIN + vesselWidth + colWidth * (i + 1) - 6;
      const lines = wrapText(col.label, colWidth - 8, 8.5, 'bold');
      lines.slice(0, 2).forEach((line, j) => p.text(right, top + (lines.length > 1 ? 12 : 18) + j * 10, line, { font: 'bold', size: 8.5, color: INK, align: 'right' }));
    });
    return top + HEAD_H;
  };

  y = header(page, y);
  if (table.rows.length === 0) {
    page.text(MARGIN + 6, y + 17, 'No vessels in this campaign.', { size: 10, color: MUTED });
    y += ROW_H;
  }
  for (const row of table.rows) {
    if (y + ROW_H > 841.89 - 80) {
      page = newPage();
      y = header(page, 60);
    }
    page.line(MARGIN, y, MARGIN + contentWidth, y, { color: RULE });
    let name = row.name;
    while (textWidth(name, 10, 'bold') > vesselWidth - 10 && name.length > 4) name = `${name.slice(0, -2)}…`;
    page.text(MARGIN + 6, y + 12, name, { font: 'bold', size: 10, color: INK });
    page.text(MARGIN + 6, y + 22, row.vessel, { size: 7.5, color: MUTED });
    row.cells.forEach((cell, i) => page.text(MARGIN + vesselWidth + colWidth * (i + 1) - 6, y + 16, cell, { size: 10, color: INK, align: 'right' }));
    y += ROW_H;
  }
  page.line(MARGIN, y, MARGIN + contentWidth, y, { color: RULE });
  y += 22;

  const notes = [
    ...table.columns.map((col) => `${col.label}: ${col.about}`),
    'A dash means the figure could not be computed (no DP time or no data), never zero.',
  ];
  const cautionHeight = 26 + CAUTION_REPORT.reduce((h, p) => h + wrapText(p, contentWidth - 24, 9).length * 12.2 + 4, 0);
  const notesHeight = 20 + notes.reduce((h, n) => h + wrapText(n, contentWidth, 8.5).length * 11.5 + 2, 0);
  if (y + notesHeight + cautionHeight > 841.89 - 60) {
    page = newPage();
    y = 64;
  }
  page.text(MARGIN, y, 'What the columns mean', { font: 'bold', size: 10, color: INK });
  y += 15;
  for (const n of notes) y = paragraph(page, MARGIN, y, contentWidth, n, 8.5, MUTED) + 2;
  y += 10;

  page.rect(MARGIN, y, contentWidth, cautionHeight, { fill: CAUTION_FILL, stroke: CAUTION_RULE });
  page.text(MARGIN + 12, y + 17, 'Caution', { font: 'bold', size: 10, color: [0.43, 0.26, 0] });
  let cy = y + 31;
  for (const p of CAUTION_REPORT) cy = paragraph(page, MARGIN + 12, cy, contentWidth - 24, p, 9) + 4;

  const stamp = `Generated ${generatedAt.toISOString().slice(0, 16).replace('T', ' ')} UTC from the Holdfast daily figures`;
  pages.forEach((p, i) => {
    p.line(MARGIN, 841.89 - 40, p.width - MARGIN, 841.89 - 40, { color: RULE });
    p.text(MARGIN, 841.89 - 26, stamp, { size: 7.5, color: MUTED });
    p.text(p.width - MARGIN, 841.89 - 26, `Page ${i + 1} of ${pages.length}`, { size: 7.5, color: MUTED, align: 'right' });
  });
  return doc.toBuffer();
}
