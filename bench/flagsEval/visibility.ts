import type { DayValue } from '../../lib/flags/window';
import { addDays } from '../../lib/time/fleetDay';

/**
 * A diagnostic beside the score, not part of it: the first day after a
 * fault's onset on which its metric left the range it had over the
 * `lookbackDays` before the onset, in the degrading direction. It separates
 * "the flag was slow" from "the data did not show the fault yet": no method
 * that judges daily figures can flag a fault before it shows in them.
 * Project's rule of thumb (no source).
 */
export function firstVisibleDay(values: readonly DayValue[], onset: string, direction: 'rising' | 'falling', lookbackDays = 30): string | null {
  const before = values.filter((v) => v.day < onset && v.day >= addDays(onset, -lookbackDays)).map((v) => v.value);
  if (before.length === 0) return null;
  const edge = direction === 'rising' ? Math.max(...before) : Math.min(...before);
  const first = values.find((v) => v.day >= onset && (direction === 'rising' ? v.value > edge : v.value < edge));
  return first?.day ?? null;
}
