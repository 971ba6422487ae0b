import { existsSync, readFileSync } from 'node:fs';
import type { FleetFile } from '../../lib/register/fleetFile';
import type { GroundTruthFile } from '../scenarios/groundTruth';
import { buildPlan, DAY_MS, type ScenarioPlan } from '../scenarios/plan';

/** UTC midnight `days` days before the day of `nowMs`: where a demo history of that length starts. */
export function historyStart(nowMs: number, days: number): number {
  return Math.floor(nowMs / DAY_MS) * DAY_MS - days * DAY_MS;
}

/** `YYYY-MM-DD` (UTC midnight) → ms; throws on anything else. */
export function parseDay(text: string): number {
  const ms = /^\d{4}-\d{2}-\d{2}$/.test(text) ? Date.parse(`${text}T00:00:00Z`) : Number.NaN;
  if (Number.isNaN(ms) || new Date(ms).toISOString().slice(0, 10) !== text) throw new Error(`not a day (YYYY-MM-DD): ${text}`);
  return ms;
}

/**
 * The scenario plan a demo run uses. A ground-truth file left by an earlier
 * run with the same seed and length keeps its history start, so that a
 * restarted demo goes on with the same faults at the same ages.
 */
export function demoPlan(fleet: FleetFile, seed: number, days: number, nowMs: number, truthFile?: string): { plan: ScenarioPlan; resumed: boolean } {
  if (truthFile && existsSync(truthFile)) {
    try {
      const truth = JSON.parse(readFileSync(truthFile, 'utf8')) as GroundTruthFile;
      const fromMs = Date.parse(truth.history.from);
      if (truth.v === 1 && truth.seed === seed && truth.history.days === days && Number.isFinite(fromMs)) {
        return { plan: buildPlan(fleet, seed, fromMs, days), resumed: true };
      }
    } catch {
      // An unreadable file is replaced.
    }
  }
  return { plan: buildPlan(fleet, seed, historyStart(nowMs, days), days), resumed: false };
}
