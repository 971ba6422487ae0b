/**
 * Values as fields of PostgreSQL's COPY text format (PostgreSQL docs, "COPY —
 * File Formats — Text Format"): columns separated by tabs, lines ended by a
 * newline, NULL as \N, and backslash, tab, newline and carriage return in
 * text escaped. Each helper returns one field, so a table's line is one
 * template string with no array in between (ingest renders every row).
 */

const SPECIAL = /[\\\t\n\r]/;
const ESCAPES: Record<string, string> = { '\\': '\\\\', '\t': '\\t', '\n': '\\n', '\r': '\\r' };

/** Text, escaped. Contract strings (ids, modes, times) never need it; the test is cheaper than the replace. */
export const copyText = (s: string): string => (SPECIAL.test(s) ? s.replace(/[\\\t\n\r]/g, (c) => ESCAPES[c]!) : s);

/** A number as JavaScript prints it (PostgreSQL reads 1.5e-7 and 1e+21 back), or NULL. */
export const copyNumber = (v: number | undefined): string => (v === undefined ? '\\N' : String(v));

export const copyBoolean = (v: boolean | undefined): string => (v === undefined ? '\\N' : v ? 't' : 'f');

/** Numbers as a PostgreSQL array literal, {1,2,3}, or NULL. */
export const copyArray = (v: readonly number[] | undefined): string => (v === undefined ? '\\N' : `{${v.join(',')}}`);
