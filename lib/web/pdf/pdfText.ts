import { decodeWinAnsi } from './winAnsi';

/**
 * Reads back the files PdfDocument writes: checks the cross-reference table
 * points at every object, and returns each page's text in drawing order.
 * It understands exactly what the writer produces (uncompressed content
 * streams, literal strings shown with Tj), not PDF in general. Used by the
 * tests, so that "the PDF holds the same numbers as the API" is checked on
 * the bytes a user downloads.
 */

export class PdfReadError extends Error {}

function readLiteral(text: string, start: number): { bytes: number[]; end: number } {
  // text[start] is "("; strings from the writer have no unescaped parentheses.
  const bytes: number[] = [];
  let i = start + 1;
  while (i < text.length && text[i] !== ')') {
    if (text[i] === '\\') {
      const next = text[i + 1]!;
      if (/[0-7]/.test(next)) {
        const oct = /^[0-7]{1,3}/.exec(text.slice(i + 1))![0];
        bytes.push(parseInt(oct, 8));
        i += 1 + oct.length;
        continue;
      }
      bytes.push(next.charCodeAt(0));
      i += 2;
      continue;
    }
    bytes.push(text.charCodeAt(i));
    i++;
  }
  return { bytes, end: i + 1 };
}

export function readPdf(file: Buffer): { pages: string[][]; objects: number } {
  const text = file.toString('latin1');
  if (!text.startsWith('%PDF-1.')) throw new PdfReadError('no %PDF header');
  const startxref = /startxref\n(\d+)\n%%EOF\n?$/.exec(text);
  if (!startxref) throw new PdfReadError('no startxref at the end');
  const xrefAt = Number(startxref[1]);
  const xref = /^xref\n0 (\d+)\n/.exec(text.slice(xrefAt));
  if (!xref) throw new PdfReadError(`startxref ${xrefAt} does not point at the xref table`);
  const size = Number(xref[1]);
  const entries = text.slice(xrefAt + xref[0].length, xrefAt + xref[0].length + 20 * size);
  for (let n = 1; n < size; n++) {
    const entry = entries.slice(20 * n, 20 * n + 20);
    const offset = Number(entry.slice(0, 10));
    if (!text.startsWith(`${n} 0 obj\n`, offset)) throw new PdfReadError(`xref entry ${n} (offset ${offset}) does not point at object ${n}`);
  }

  const pages: string[][] = [];
  const streams = /stream\n([\s\S]*?)\nendstream/g;
  for (let m = streams.exec(text); m; m = streams.exec(text)) {
    const content = m[1]!;
    const lines: string[] = [];
    for (let i = content.indexOf('('); i >= 0; i = content.indexOf('(', i)) {
      const { bytes, end } = readLiteral(content, i);
      if (/^ Tj/.test(content.slice(end))) lines.push(decodeWinAnsi(bytes));
      i = end;
    }
    pages.push(lines);
  }
  return { pages, objects: size - 1 };
}
