import { addDays } from '../../time/fleetDay';

export interface DayRange {
  vesselId: number;
  /** Inclusive YYYY-MM-DD bounds. */
  from: string;
  to: string;
}

/**
 * Vessel-days merged into runs of consecutive days per vessel, sorted by
 * vessel then day (duplicates collapse), so the aggregate queries match each
 * stored row to one range.
 */
export function dayRanges(days: readonly { vesselId: number; day: string }[]): DayRange[] {
  const sorted = [...days].sort((a, b) => a.vesselId - b.vesselId || (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
  const out: DayRange[] = [];
  for (const { vesselId, day } of sorted) {
    const last = out[out.length - 1];
    if (last && last.vesselId === vesselId && (day === last.to || day === addDays(last.to, 1))) last.to = day;
    else out.push({ vesselId, from: day, to: day });
  }
  return out;
}
