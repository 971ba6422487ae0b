import type { CsvValue } from './csv';

/**
 * JSON records → CSV header and rows. Columns follow the record schema's
 * property order (lib/api/schemas.ts), so CSV and JSON name the same fields.
 * An object-valued field (within_pct) becomes one column per key,
 * `within_pct_3`, `within_pct_5`: the keys are the union of `baseline` (the
 * limits configured now) and the keys found in the records (a day computed
 * under other limits keeps its figures), in numeric order.
 */

export interface CsvTable {
  header: string[];
  rows: CsvValue[][];
}

type JsonRecord = Record<string, unknown>;

const byNumber = (a: string, b: string) => Number(a) - Number(b) || a.localeCompare(b);

function keysOf(records: readonly object[], field: string, baseline: readonly string[]): string[] {
  const keys = new Set(baseline);
  for (const r of records) {
    const value = (r as JsonRecord)[field];
    if (value && typeof value === 'object') for (const k of Object.keys(value)) keys.add(k);
  }
  return [...keys].sort(byNumber);
}

export function flattenRecords(
  records: readonly object[],
  columns: readonly string[],
  nested: Readonly<Record<string, readonly string[]>> = {},
): CsvTable {
  const expanded = new Map(Object.entries(nested).map(([field, baseline]) => [field, keysOf(records, field, baseline)]));
  const header = columns.flatMap((c) => (expanded.has(c) ? expanded.get(c)!.map((k) => `${c}_${k}`) : [c]));
  const rows = records.map((record) => {
    const r = record as JsonRecord;
    return columns.flatMap((c): CsvValue[] => {
      const keys = expanded.get(c);
      if (!keys) return [r[c] as CsvValue];
      const inner = (r[c] ?? {}) as Record<string, CsvValue>;
      return keys.map((k) => inner[k] ?? null);
    });
  });
  return { header, rows };
}
