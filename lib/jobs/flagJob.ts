import type { Pool } from 'pg';
import { evaluateDay, type EvaluateSummary } from '../flags/evaluate';
import { readFlagSettings } from '../flags/store/settings';
import { addDays, fleetDay } from '../time/fleetDay';
import type { VesselDay } from './dailyRollup';

/**
 * When the flag job evaluates, and what (lib/flags/evaluate.ts has the how):
 *
 * - nightly, after the daily figures of yesterday are computed: every vessel,
 *   on yesterday (the last complete fleet day);
 * - after a dirty-day recompute that changed days inside yesterday's
 *   trailing window (late or replayed records): those vessels again, on
 *   yesterday. Evaluating a day twice changes nothing that was already
 *   decided (no flag is duplicated, clear counts do not move), but a
 *   series whose condition now holds with the corrected figures opens its
 *   flag. Days older than the window cannot change yesterday's verdict;
 *   today is never evaluated (its figures are still growing).
 *
 * `holdfast flags evaluate --day DAY` (or --from/--to) evaluates chosen days
 * on demand, oldest first, so a backfilled history opens its flags on the
 * days they would have opened.
 */

export function lastCompleteDay(timeZone: string, now = new Date()): string {
  return addDays(fleetDay(now, timeZone), -1);
}

/** Vessels whose recomputed days fall inside `day`'s trailing window of `windowDays`. */
export function vesselsTouchingWindow(days: readonly VesselDay[], day: string, windowDays: number): number[] {
  const from = addDays(day, -(windowDays - 1));
  return [...new Set(days.filter((d) => d.day >= from && d.day <= day).map((d) => d.vesselId))].sort((a, b) => a - b);
}

/** After a dirty-day recompute: re-evaluate yesterday for the vessels it touched; null when it touched none. */
export async function evaluateAfterRecompute(pool: Pool, days: readonly VesselDay[], timeZone: string, now = new Date()): Promise<EvaluateSummary | null> {
  const day = lastCompleteDay(timeZone, now);
  const settings = await readFlagSettings(pool);
  const vesselIds = vesselsTouchingWindow(days, day, settings.windowDays);
  if (vesselIds.length === 0) return null;
  return evaluateDay(pool, day, { timeZone, vesselIds, settings });
}

/** Every vessel on each day of `days` in order (the nightly run is one day; the CLI may give a range). */
export async function evaluateDays(pool: Pool, days: readonly string[], timeZone: string): Promise<EvaluateSummary[]> {
  const settings = await readFlagSettings(pool);
  const out: EvaluateSummary[] = [];
  for (const day of [...days].sort()) out.push(await evaluateDay(pool, day, { timeZone, settings }));
  return out;
}

/** One line for the log. */
export function describeEvaluation(s: EvaluateSummary): string {
  return `flags ${s.day}: ${s.evaluated} series judged on ${s.vessels} vessel(s), ${s.opened.length} opened, ${s.updated} updated, ${s.proposedClose} proposed for closing`;
}
