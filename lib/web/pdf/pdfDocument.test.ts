import { describe, expect, it } from 'vitest';
import { PdfDocument, pdfDate, pdfString } from './pdfDocument';
import { readPdf } from './pdfText';
import { encodeWinAnsi, normaliseText, textWidth, wrapText } from './winAnsi';

describe('WinAnsi text for the standard fonts', () => {
  it('measures with the AFM widths of Helvetica and Helvetica-Bold', () => {
    // Helvetica AFM: H 722, o 556, l 222, d 556, f 278, a 556, s 500, t 278 → 3668/1000 em.
    expect(textWidth('Holdfast', 10)).toBeCloseTo(36.68, 10);
    // Helvetica-Bold AFM: H 722, o 611, l 278, d 611, f 333, a 556, s 556, t 333 → 4000/1000 em.
    expect(textWidth('Holdfast', 10, 'bold')).toBeCloseTo(40, 10);
    // Accented letters take their base letter's width (Helvetica AFM: aring = a = 556).
    expect(textWidth('å', 1)).toBeCloseTo(0.556, 10);
  });

  it('encodes Latin-1 letters and typographic marks, spells out the rest', () => {
    expect(encodeWinAnsi('Ø–·°')).toEqual([0xd8, 0x96, 0xb7, 0xb0]);
    expect(normaliseText('p95 ≥ 10 m, ⅔')).toBe('p95 >= 10 m, 2/3');
    expect(encodeWinAnsi('→')).toEqual([63]);
  });

  it('wraps at spaces within the width', () => {
    const lines = wrapText('one two three four five six', textWidth('one two three', 10), 10);
    expect(lines).toEqual(['one two three', 'four five six']);
  });
});

describe('PdfDocument', () => {
  it('escapes parentheses and backslashes, and writes high bytes in octal', () => {
    expect(pdfString(encodeWinAnsi('a(b)c\\ø'))).toBe('(a\\(b\\)c\\\\\\370)');
  });

  it('writes a file whose cross-reference table points at every object, and whose text reads back', () => {
    const doc = new PdfDocument({ title: 'Test (1)', created: new Date('2026-12-02T10:20:30Z') });
    const p1 = doc.addPage();
    p1.text(48, 60, 'Skerrin Ridge buoy (Tarnholm) – 3.09 m', { font: 'bold', size: 12 });
    p1.rect(48, 80, 100, 20, { fill: [0.9, 0.9, 0.9], stroke: [0, 0, 0] });
    p1.line(48, 110, 200, 110);
    const p2 = doc.addPage();
    p2.text(500, 60, 'Øresund 99.5 %', { align: 'right' });
    const file = doc.toBuffer();

    const text = file.toString('latin1');
    expect(text.startsWith('%PDF-1.4\n')).toBe(true);
    expect(text.endsWith('%%EOF\n')).toBe(true);
    expect(text).toContain('/CreationDate (D:20261202102030Z)');
    expect(text).toContain('/Count 2');
    const { pages, objects } = readPdf(file);
    expect(objects).toBe(9); // catalog, pages, 2 fonts, info, 2 × (page, content)
    expect(pages).toEqual([['Skerrin Ridge buoy (Tarnholm) – 3.09 m'], ['Øresund 99.5 %']]);
  });

  it('has xref entries of exactly 20 bytes (PDF 32000-1 §7.5.4)', () => {
    const doc = new PdfDocument({ title: 't', created: new Date(0) });
    doc.addPage();
    const text = doc.toBuffer().toString('latin1');
    const xref = text.slice(text.indexOf('xref\n') + 5, text.indexOf('trailer'));
    const [, ...entries] = xref.split('\n').filter(Boolean);
    expect(entries.every((e) => `${e}\n`.length === 20)).toBe(true);
  });

  it('refuses a file whose offsets are wrong', () => {
    const doc = new PdfDocument({ title: 't', created: new Date(0) });
    doc.addPage().text(10, 10, 'x');
    const bad = Buffer.from(doc.toBuffer().toString('latin1').replace('%PDF-1.4\n', '%PDF-1.4\n\n'), 'latin1');
    expect(() => readPdf(bad)).toThrow(/does not point at/);
  });

  it('dates in UTC', () => {
    expect(pdfDate(new Date('2026-03-29T01:30:00+02:00'))).toBe('D:20260328233000Z');
  });
});
