/**
 * Values → one line of PostgreSQL's COPY text format (PostgreSQL docs,
 * "COPY — File Formats — Text Format"): columns separated by tabs, NULL as
 * \N, and backslash, tab, newline and carriage return escaped.
 */
function field(value: unknown): string {
  if (value === null || value === undefined) return '\\N';
  if (typeof value === 'number') return String(value);
  if (typeof value === 'boolean') return value ? 't' : 'f';
  return String(value).replace(/[\\\t\n\r]/g, (c) => (c === '\\' ? '\\\\' : c === '\t' ? '\\t' : c === '\n' ? '\\n' : '\\r'));
}

export function copyLine(values: readonly unknown[]): string {
  let line = field(values[0]);
  for (let i = 1; i < values.length; i++) line += '\t' + field(values[i]);
  return line + '\n';
}
