import { encodeWinAnsi, textWidth, type FontName } from './winAnsi';

/**
 * A small PDF writer: A4 pages of text, lines and filled rectangles in the
 * two standard Helvetica fonts — all a printed report needs, with no
 * dependency, no external service and nothing to install.
 *
 * Follows PDF 32000-1:2008 (ISO 32000-1): file structure §7.5 (header,
 * body of indirect objects, cross-reference table of 20-byte entries,
 * trailer), content streams §7.8 and the operators of §8–9 (q/Q, cm-free
 * absolute coordinates, re f/S, m l S, BT Tf Td Tj ET, rg/RG, w). Content
 * streams are left uncompressed: the reports are small, and a person (or a
 * test) can read the text straight from the file.
 *
 * Coordinates passed in are from the top-left corner, in points (1/72 in),
 * as a page is read; they are flipped to PDF's bottom-left origin here.
 */

export const A4 = { width: 595.28, height: 841.89 } as const;

export type Rgb = readonly [number, number, number];

const num = (x: number) => {
  const r = Math.round(x * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
};
const colour = (c: Rgb) => c.map((v) => num(Math.min(1, Math.max(0, v)))).join(' ');

/** A PDF literal string from WinAnsi bytes: ( ) \ escaped, bytes outside printable ASCII as octal. */
export function pdfString(bytes: readonly number[]): string {
  let out = '(';
  for (const b of bytes) {
    if (b === 0x28 || b === 0x29 || b === 0x5c) out += `\\${String.fromCharCode(b)}`;
    else if (b < 32 || b > 126) out += `\\${b.toString(8).padStart(3, '0')}`;
    else out += String.fromCharCode(b);
  }
  return `${out})`;
}

const FONT_RESOURCE: Record<FontName, string> = { regular: 'F1', bold: 'F2' };

export interface TextOptions {
  font?: FontName;
  size?: number;
  color?: Rgb;
  align?: 'left' | 'right' | 'center';
}

export class PdfPage {
  readonly width = A4.width;
  readonly height = A4.height;
  private readonly ops: string[] = [];

  private y(top: number): number {
    return this.height - top;
  }

  /** Text whose baseline is at `top`; `x` is its left, right or centre edge by `align`. */
  text(x: number, top: number, text: string, o: TextOptions = {}): void {
    const font = o.font ?? 'regular';
    const size = o.size ?? 10;
    const w = textWidth(text, size, font);
    const left = o.align === 'right' ? x - w : o.align === 'center' ? x - w / 2 : x;
    this.ops.push(
      `${colour(o.color ?? [0, 0, 0])} rg BT /${FONT_RESOURCE[font]} ${num(size)} Tf ${num(left)} ${num(this.y(top))} Td ${pdfString(encodeWinAnsi(text, font))} Tj ET`,
    );
  }

  line(x1: number, top1: number, x2: number, top2: number, o: { width?: number; color?: Rgb } = {}): void {
    this.ops.push(
      `${colour(o.color ?? [0, 0, 0])} RG ${num(o.width ?? 0.5)} w ${num(x1)} ${num(this.y(top1))} m ${num(x2)} ${num(this.y(top2))} l S`,
    );
  }

  rect(x: number, top: number, w: number, h: number, o: { fill?: Rgb; stroke?: Rgb; width?: number }): void {
    const box = `${num(x)} ${num(this.y(top + h))} ${num(w)} ${num(h)} re`;
    if (o.fill) this.ops.push(`${colour(o.fill)} rg ${box} f`);
    if (o.stroke) this.ops.push(`${colour(o.stroke)} RG ${num(o.width ?? 0.5)} w ${box} S`);
  }

  content(): string {
    return this.ops.join('\n');
  }
}

export interface PdfInfo {
  title: string;
  subject?: string;
  created: Date;
}

/** D:YYYYMMDDHHmmSSZ (§7.9.4), in UTC. */
export function pdfDate(d: Date): string {
  return `D:${d.toISOString().replace(/[-:T]/g, '').slice(0, 14)}Z`;
}

export class PdfDocument {
  private readonly pages: PdfPage[] = [];

  constructor(private readonly info: PdfInfo) {}

  addPage(): PdfPage {
    const page = new PdfPage();
    this.pages.push(page);
    return page;
  }

  get pageCount(): number {
    return this.pages.length;
  }

  /** The whole file. Built as a Latin-1 string (one character per byte), so string lengths are byte offsets. */
  toBuffer(): Buffer {
    const objects: string[] = []; // objects[i] is object number i + 1
    const add = (body: string) => objects.push(body);
    const pageIds = this.pages.map((_, i) => 6 + 2 * i);

    add('<< /Type /Catalog /Pages 2 0 R >>');
    add(`<< /Type /Pages /Kids [${pageIds.map((id) => `${id} 0 R`).join(' ')}] /Count ${this.pages.length} >>`);
    add('<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica /Encoding /WinAnsiEncoding >>');
    add('<< /Type /Font /Subtype /Type1 /BaseFont /Helvetica-Bold /Encoding /WinAnsiEncoding >>');
    const infoString = (text: string) => pdfString(encodeWinAnsi(text));
    add(
      `<< /Title ${infoString(this.info.title)}${this.info.subject ? ` /Subject ${infoString(this.info.subject)}` : ''}` +
        ` /Producer (Holdfast) /CreationDate (${pdfDate(this.info.created)}) >>`,
    );
    for (const page of this.pages) {
      const id = objects.length + 1;
      add(
        `<< /Type /Page /Parent 2 0 R /MediaBox [0 0 ${A4.width} ${A4.height}] ` +
          `/Resources << /Font << /F1 3 0 R /F2 4 0 R >> >> /Contents ${id + 1} 0 R >>`,
      );
      const content = page.content();
      add(`<< /Length ${content.length} >>\nstream\n${content}\nendstream`);
    }

    // The second line's bytes above 127 tell transfer programs the file is binary (§7.5.2).
    let out = '%PDF-1.4\n%\xe2\xe3\xcf\xd3\n';
    const offsets: number[] = [];
    objects.forEach((body, i) => {
      offsets.push(out.length);
      out += `${i + 1} 0 obj\n${body}\nendobj\n`;
    });
    const xref = out.length;
    out += `xref\n0 ${objects.length + 1}\n0000000000 65535 f \n`;
    for (const o of offsets) out += `${String(o).padStart(10, '0')} 00000 n \n`;
    out += `trailer\n<< /Size ${objects.length + 1} /Root 1 0 R /Info 5 0 R >>\nstartxref\n${xref}\n%%EOF\n`;
    return Buffer.from(out, 'latin1');
  }
}
