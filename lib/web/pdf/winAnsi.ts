/**
 * Text for the PDF's two standard fonts, Helvetica and Helvetica-Bold, with
 * WinAnsiEncoding (PDF 32000-1:2008, Annex D.2): every PDF reader has these
 * fonts, so nothing is embedded and the file stays small.
 *
 * Widths are in 1/1000 of the font size, from Adobe's Font Metrics (AFM)
 * files for Helvetica and Helvetica-Bold (the Core 14 AFM set). Only the
 * characters Holdfast writes are measured exactly: ASCII, the Latin-1
 * letters used in vessel and place names, and a few punctuation marks.
 * Characters outside WinAnsi are spelled out (≥ → ">=") or become "?".
 */

// Printable ASCII 32..126.
// prettier-ignore
const ASCII_REGULAR = [
  278, 278, 355, 556, 556, 889, 667, 191, 333, 333, 389, 584, 278, 333, 278, 278,
  556, 556, 556, 556, 556, 556, 556, 556, 556, 556, 278, 278, 584, 584, 584, 556,
  1015, 667, 667, 722, 722, 667, 611, 778, 722, 278, 500, 667, 556, 833, 722, 778,
  667, 778, 722, 667, 611, 722, 667, 944, 667, 667, 611, 278, 278, 278, 469, 556,
  333, 556, 556, 500, 556, 556, 278, 556, 556, 222, 222, 500, 222, 833, 556, 556,
  556, 556, 333, 500, 278, 556, 500, 722, 500, 500, 500, 334, 260, 334, 584,
];
// prettier-ignore
const ASCII_BOLD = [
  278, 333, 474, 556, 556, 889, 722, 238, 333, 333, 389, 584, 278, 333, 278, 278,
  556, 556, 556, 556, 556, 556, 556, 556, 556, 556, 333, 333, 584, 584, 584, 611,
  975, 722, 722, 722, 722, 667, 611, 778, 722, 278, 556, 722, 611, 833, 722, 778,
  667, 778, 722, 667, 611, 722, 667, 944, 667, 667, 611, 333, 278, 333, 584, 556,
  333, 556, 611, 556, 611, 556, 333, 611, 611, 278, 278, 556, 278, 889, 611, 611,
  611, 611, 389, 556, 333, 611, 556, 778, 556, 556, 500, 389, 280, 389, 584,
];

/** Non-ASCII characters written: WinAnsi code and widths [regular, bold]. */
const EXTRA: Record<string, [code: number, regular: number, bold: number]> = {
  '€': [0x80, 556, 556],
  '…': [0x85, 1000, 1000],
  '‘': [0x91, 222, 278],
  '’': [0x92, 222, 278],
  '“': [0x93, 333, 500],
  '”': [0x94, 333, 500],
  '•': [0x95, 350, 350],
  '–': [0x96, 556, 556],
  '—': [0x97, 1000, 1000],
  '\u00a0': [0xa0, 278, 278],
  '°': [0xb0, 400, 400],
  '±': [0xb1, 584, 584],
  '²': [0xb2, 333, 333],
  '·': [0xb7, 278, 278],
  '×': [0xd7, 584, 584],
  '÷': [0xf7, 584, 584],
  'Æ': [0xc6, 1000, 1000],
  'Ø': [0xd8, 778, 778],
  'ß': [0xdf, 611, 611],
  'æ': [0xe6, 889, 889],
  'ø': [0xf8, 611, 611],
};

/** Spelled out: characters outside WinAnsi that the pages use. */
const SPELLED: Record<string, string> = { '≥': '>=', '≤': '<=', '−': '-', '⅔': '2/3', '\u2009': ' ', '\u202f': ' ' };

export type FontName = 'regular' | 'bold';

/** A Latin-1 letter with a diacritic: its WinAnsi code is its code point, its width its base letter's. */
function latin1(ch: string): { code: number; base: string } | null {
  const cp = ch.codePointAt(0)!;
  if (cp < 0xc0 || cp > 0xff || cp === 0xd7 || cp === 0xf7) return null;
  const base = ch.normalize('NFD')[0]!;
  return base.charCodeAt(0) < 128 && base !== ch ? { code: cp, base } : null;
}

function glyph(ch: string, font: FontName): { code: number; width: number } {
  const cp = ch.codePointAt(0)!;
  const table = font === 'bold' ? ASCII_BOLD : ASCII_REGULAR;
  if (cp >= 32 && cp <= 126) return { code: cp, width: table[cp - 32]! };
  const extra = EXTRA[ch];
  if (extra) return { code: extra[0], width: font === 'bold' ? extra[2] : extra[1] };
  const l = latin1(ch);
  if (l) return { code: l.code, width: table[l.base.charCodeAt(0) - 32]! };
  return { code: 63, width: table[63 - 32]! }; // "?"
}

/** Replace what WinAnsi cannot hold, and line breaks and tabs by spaces. */
export function normaliseText(text: string): string {
  let out = '';
  for (const ch of text.replace(/[\r\n\t]+/g, ' ')) out += SPELLED[ch] ?? ch;
  return out;
}

/** The WinAnsi bytes of `text` (after normaliseText). */
export function encodeWinAnsi(text: string, font: FontName = 'regular'): number[] {
  return [...normaliseText(text)].map((ch) => glyph(ch, font).code);
}

/** Width of `text` in points at `size`. */
export function textWidth(text: string, size: number, font: FontName = 'regular'): number {
  let units = 0;
  for (const ch of normaliseText(text)) units += glyph(ch, font).width;
  return (units * size) / 1000;
}

/** Break `text` into lines no wider than `width` points, at spaces (a word longer than a line stands alone). */
export function wrapText(text: string, width: number, size: number, font: FontName = 'regular'): string[] {
  const words = normaliseText(text).split(' ').filter((w) => w !== '');
  const lines: string[] = [];
  let line = '';
  for (const word of words) {
    const candidate = line ? `${line} ${word}` : word;
    if (line && textWidth(candidate, size, font) > width) {
      lines.push(line);
      line = word;
    } else line = candidate;
  }
  if (line) lines.push(line);
  return lines;
}

/** WinAnsi code → character, for reading back what was written (tests, checks). */
export function decodeWinAnsi(bytes: readonly number[]): string {
  const reverse = new Map<number, string>(Object.entries(EXTRA).map(([ch, [code]]) => [code, ch]));
  return bytes.map((b) => reverse.get(b) ?? String.fromCharCode(b)).join('');
}
