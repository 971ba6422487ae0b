import type { PowerRecord } from '../telemetry/schemas';

/**
 * Power limit figures per bus, and per vessel as the sum over its buses.
 * Source: docs spec metrics-v1 "Power limit": limit_events = Σ limit_events;
 * limit_seconds = Σ limit_s; limit_events_per_dp_day = limit_events·24 /
 * dp_hours (undefined when dp_hours is 0: "no DP time", never 0 or
 * infinity); blackouts = intervals with `blackout` true; peak_load_ratio =
 * max over intervals and buses of kw_max / kw_available (kw_available > 0).
 * Every interval of the day counts, whatever the DP mode.
 *
 * Choices the spec leaves open: fields are optional in the contract; sums
 * skip buses that did not send the field, and are null when no bus sent it
 * (missing is a gap, never 0). peak_load_ratio is null when no interval has
 * both kw_max and kw_available > 0.
 */

/** limit_events · 24 / dp_hours; null when dp_hours is 0 ("no DP time"). */
export function limitEventsPerDpDay(limitEvents: number, dpHours: number): number | null {
  if (!(dpHours > 0)) return null;
  return (limitEvents * 24) / dpHours;
}

export interface PowerFigures {
  limit_events: number | null;
  limit_seconds: number | null;
  blackouts: number;
  peak_load_ratio: number | null;
}

/** The day's figures over `records`, for one bus when `busId` is given, else all buses (the vessel). */
export function powerFigures(records: Iterable<Pick<PowerRecord, 'buses'>>, busId?: string): PowerFigures {
  let events: number | null = null;
  let seconds: number | null = null;
  let blackouts = 0;
  let peak: number | null = null;
  for (const r of records) {
    for (const b of r.buses) {
      if (busId !== undefined && b.id !== busId) continue;
      if (b.limit_events !== undefined) events = (events ?? 0) + b.limit_events;
      if (b.limit_s !== undefined) seconds = (seconds ?? 0) + b.limit_s;
      if (b.blackout === true) blackouts++;
      if (b.kw_max !== undefined && b.kw_available !== undefined && b.kw_available > 0) {
        const ratio = b.kw_max / b.kw_available;
        if (peak === null || ratio > peak) peak = ratio;
      }
    }
  }
  return { limit_events: events, limit_seconds: seconds, blackouts, peak_load_ratio: peak };
}
