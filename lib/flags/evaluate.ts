import type { Pool } from 'pg';
import type { FlagSettings } from './config';
import { evidenceOf } from './evidence';
import { explain } from './explain';
import { judge } from './judge';
import { nextStep } from './lifecycle';
import { WATCHED_SERIES } from './series';
import { lastClosedDays, liveFlags, openFlag, seriesIdKey, updateFlag } from './store/flagStore';
import { readSeries } from './store/readSeries';
import { readFlagSettings } from './store/settings';
import { verdictOf } from './verdict';
import { rangesFor } from './window';

/**
 * Evaluate every watched series of some vessels on one fleet day, and open,
 * update or propose closing their flags (lifecycle.ts). Idempotent: running
 * it again for the same day changes nothing, and evaluating an older day
 * after a newer one leaves the live flags alone. A series is evaluated on a
 * day only when it has a figure that day, so days without data neither open
 * flags nor count towards clearing them.
 */

export interface EvaluateOptions {
  timeZone: string;
  /** Default: every registered vessel. */
  vesselIds?: readonly number[];
  /** Default: the stored settings (flag_settings). */
  settings?: FlagSettings;
}

export interface EvaluateSummary {
  day: string;
  vessels: number;
  /** Series with a figure on the day that were judged. */
  evaluated: number;
  opened: number[];
  updated: number;
  proposedClose: number;
  /** Units whose id cannot be a flag subject (not evaluated). */
  skippedUnits: string[];
}

export async function evaluateDay(pool: Pool, day: string, options: EvaluateOptions): Promise<EvaluateSummary> {
  const settings = options.settings ?? (await readFlagSettings(pool));
  const vesselIds = options.vesselIds ?? (await pool.query<{ id: number }>('SELECT id FROM vessel ORDER BY id')).rows.map((r) => r.id);
  const summary: EvaluateSummary = { day, vessels: vesselIds.length, evaluated: 0, opened: [], updated: 0, proposedClose: 0, skippedUnits: [] };
  if (vesselIds.length === 0) return summary;

  const ranges = rangesFor(day, settings);
  const [{ series, wind, beam, skippedUnits }, live, closed] = await Promise.all([
    readSeries(pool, vesselIds, ranges.baseline.from, day),
    liveFlags(pool, vesselIds),
    lastClosedDays(pool, vesselIds, options.timeZone),
  ]);
  summary.skippedUnits = skippedUnits;
  const noWind = new Map<string, number>();

  for (const s of series) {
    const watched = WATCHED_SERIES[s.key];
    const seriesSettings = settings.series[s.key];
    if (!seriesSettings.enabled || s.values.at(-1)?.day !== day) continue;
    const id = { vesselId: s.vesselId, subject: s.subject, metric: s.key };
    const key = seriesIdKey(id);
    const judged = judge(s.values, wind.get(s.vesselId) ?? noWind, watched, seriesSettings, settings, day, closed.get(key) ?? null, beam.get(s.vesselId));
    if (!judged) continue;
    const { detection } = judged;
    summary.evaluated++;
    const verdict = verdictOf(detection, watched.direction);
    const step = nextStep(live.get(key) ?? null, day, detection.holds, detection.either, verdict?.severity ?? null, settings.closeAfterClearDays);
    if (step.kind === 'open') {
      const client = await pool.connect();
      try {
        await client.query('BEGIN');
        const flagId = await openFlag(client, {
          ...id,
          method: verdict!.method,
          severity: step.severity,
          openedDay: day,
          windowFrom: detection.windowFrom,
          windowTo: day,
          statistic: verdict!.statistic,
          statisticName: verdict!.statisticName,
          explanation: explain(s.subject, watched, judged, settings),
          evidence: evidenceOf(judged, settings, watched.direction),
        });
        await client.query('COMMIT');
        if (flagId !== null) summary.opened.push(flagId);
      } catch (error) {
        await client.query('ROLLBACK').catch(() => {});
        throw error;
      } finally {
        client.release();
      }
    } else if (step.kind === 'update') {
      const changed = await updateFlag(pool, { id: step.id, day, severity: step.severity, clearDays: step.clearDays, closeProposedDay: step.closeProposedDay });
      if (changed) {
        summary.updated++;
        if (step.closeProposedDay === day) summary.proposedClose++;
      }
    }
  }
  return summary;
}
