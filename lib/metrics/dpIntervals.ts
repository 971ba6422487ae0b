import type { StationRecord } from '../telemetry/schemas';

/**
 * "DP intervals": `station` intervals whose `mode` is `auto_position`; the
 * accuracy, heading and environment figures use only these.
 * Source: docs spec metrics-v1 "Station-keeping accuracy".
 */
export function isDpInterval(r: Pick<StationRecord, 'mode'>): boolean {
  return r.mode === 'auto_position';
}

/** dp_hours = Σ dp_s / 3600 over all `station` intervals of the day (any mode). */
export function dpHours(records: Iterable<Pick<StationRecord, 'dp_s'>>): number {
  let s = 0;
  for (const r of records) s += r.dp_s;
  return s / 3600;
}
