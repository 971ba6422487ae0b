import { addDays } from '../time/fleetDay';
import { worse, type Severity } from './verdict';

/**
 * What evaluating day D does to one watched series' flag (metrics-v1 "Trend
 * flags": open → acknowledged → closed; one live flag per series; re-runs
 * never duplicate). Pure; the store applies the result.
 *
 * - No live flag: open one if the condition holds on D.
 * - A live flag (open or acknowledged) last evaluated before D: the condition
 *   still holds → clear_days = 0 and any close proposal is withdrawn; it does not →
 *   clear_days + 1, and once clear_days reaches closeAfterClearDays the flag
 *   proposes closing (close_proposed_day = D). Severity only escalates.
 * - A live flag already evaluated on D or later: nothing (a re-run, or an
 *   older day re-evaluated after late data must not rewind the count).
 * Only a person closes a flag (resolved or dismissed).
 */

export interface LiveFlag {
  id: number;
  severity: Severity;
  clearDays: number;
  lastEvaluatedDay: string;
  closeProposedDay: string | null;
}

export type Step =
  | { kind: 'none' }
  | { kind: 'open'; severity: Severity }
  | { kind: 'update'; id: number; severity: Severity; clearDays: number; closeProposedDay: string | null };

/**
 * `opens`: the condition to open a flag holds on `day` (with `severity`);
 * `stillHolds`: the weaker condition that keeps an open flag from counting a
 * clear day (detect.ts: both methods to open, either to stay).
 */
export function nextStep(live: LiveFlag | null, day: string, opens: boolean, stillHolds: boolean, severity: Severity | null, closeAfterClearDays: number): Step {
  if (!live) return opens && severity ? { kind: 'open', severity } : { kind: 'none' };
  if (day <= live.lastEvaluatedDay) return { kind: 'none' };
  if (opens || stillHolds) {
    return { kind: 'update', id: live.id, severity: severity ? worse(live.severity, severity) : live.severity, clearDays: 0, closeProposedDay: null };
  }
  const clearDays = live.clearDays + 1;
  const proposed = live.closeProposedDay ?? (clearDays >= closeAfterClearDays ? day : null);
  return { kind: 'update', id: live.id, severity: live.severity, clearDays, closeProposedDay: proposed };
}

/**
 * After a flag of the series was closed on `closedDay`, the series is judged
 * only on days after it, window and baseline alike: closing accepts the
 * series as it stands as the new normal. A dismissed flag is then not
 * raised again from the same evidence, and after a repair the trend starts
 * from the repair. Returns the first day that may be used.
 */
export function firstDayAfterClose(from: string, closedDay: string | null): string {
  if (!closedDay) return from;
  const after = addDays(closedDay, 1);
  return after > from ? after : from;
}
