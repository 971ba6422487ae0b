import { canSeeDay, canSeeSpan, canSeeVessel, type Scope } from '../auth/scope';
import { fleetDay } from '../time/fleetDay';
import { notFound } from './errors';

/**
 * The scope rule (lib/auth/scope.ts) applied to what the API and the pages
 * read. The queries read as for the whole fleet; these filters drop what the
 * caller may not see, so there is one rule and no query of its own per role.
 * Answers are bounded (366 days, one vessel's flags), so filtering after
 * reading costs little.
 */

/** 404, not 403, for a vessel out of scope: a charterer must not learn which keys exist. */
export function requireVessel(scope: Scope, key: string): void {
  if (!canSeeVessel(scope, key)) throw notFound('vessel', key);
}

/** Rows of one vessel keyed by fleet day, only on the days the scope shows. */
export function visibleDayRows<T extends { day: string }>(scope: Scope, vesselKey: string, rows: readonly T[]): T[] {
  return scope.kind === 'fleet' ? [...rows] : rows.filter((r) => canSeeDay(scope, vesselKey, r.day));
}

/** Flags (or anything computed over a window) whose every day is visible. */
export function visibleFlags<T extends { vessel: string; window_from: string; window_to: string }>(scope: Scope, flags: readonly T[]): T[] {
  return scope.kind === 'fleet' ? [...flags] : flags.filter((f) => canSeeSpan(scope, f.vessel, f.window_from, f.window_to));
}

/** A time stamp shown only when its fleet day is visible (a charterer must not see activity outside its days). */
export function visibleInstant(scope: Scope, vesselKey: string, at: Date | null, timeZone: string): Date | null {
  if (!at || scope.kind === 'fleet') return at;
  return canSeeDay(scope, vesselKey, fleetDay(at, timeZone)) ? at : null;
}
