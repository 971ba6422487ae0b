/**
 * CSV text by RFC 4180: records end in CRLF, the first record is the header,
 * a field is quoted when it holds a comma, a double quote, CR or LF, and a
 * double quote inside a quoted field is doubled.
 * Source: RFC 4180 "Common Format and MIME Type for Comma-Separated Values
 * (CSV) Files", section 2.
 *
 * Values: null (and undefined) is the empty field, so "not computed" stays
 * apart from 0; numbers are written by JavaScript's shortest round-trip form
 * (String(n)), so no precision is lost; booleans are `true` / `false`.
 */

export type CsvValue = string | number | boolean | null | undefined;

const NEEDS_QUOTES = /[",\r\n]/;

export function csvField(value: CsvValue): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  return NEEDS_QUOTES.test(value) ? `"${value.replaceAll('"', '""')}"` : value;
}

export function toCsv(header: readonly string[], rows: readonly (readonly CsvValue[])[]): string {
  const line = (fields: readonly CsvValue[]) => fields.map(csvField).join(',') + '\r\n';
  return line(header) + rows.map(line).join('');
}
