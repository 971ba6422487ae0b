import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { scoreFlags, scoreLine, type RaisedFlag, type Score } from '../lib/flags/evaluation/score';
import { syntheticFleet } from '../lib/flags/evaluation/syntheticFleet';
import { evaluateDays } from '../lib/jobs/flagJob';
import { addDays } from '../lib/time/fleetDay';
import { daysBetween } from '../lib/time/dayRange';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { insertSyntheticFleet } from './flagsFixtures';

/**
 * The small version of `npm run eval:flags` that CI runs: the flag job with
 * its default settings, day by day, over an invented fleet's daily figures
 * with known faults (lib/flags/evaluation/syntheticFleet.ts: the simulator's
 * faults as they show in the daily series, plus a weather-only vessel and
 * healthy ones with persistent weather and bursts), on a real database.
 * The full evaluation on simulated telemetry is bench/flagsEval.ts.
 */

describe('flag evaluation on a synthetic fleet with known faults', () => {
  let db: TestDatabase;
  let score: Score;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const fleet = syntheticFleet({ seed: 6, from: '2026-04-01', days: 100, healthy: 8, onsetDay: 60 });
    await insertSyntheticFleet(db.pool, fleet);
    await evaluateDays(db.pool, daysBetween(addDays(fleet.from, 9), addDays(fleet.from, fleet.days - 1)), 'UTC');
    const { rows } = await db.pool.query<RaisedFlag>(
      `SELECT v.key AS vessel, f.subject, f.metric, f.opened_day::text AS opened_day FROM flag f JOIN vessel v ON v.id = f.vessel_id`,
    );
    score = scoreFlags(fleet.truth, rows);
    console.log(scoreLine(score));
  }, 240_000);
  afterAll(() => db?.drop());

  it('flags every seeded fault and nothing else (targets of issue 6: P ≥ 0.9, R ≥ 0.9)', () => {
    expect(score.falseFlags).toEqual([]);
    expect(score.precision).toBeGreaterThanOrEqual(0.9);
    expect(score.recall).toBeGreaterThanOrEqual(0.9);
  });

  it('does not flag the vessel whose only change is the weather', () => {
    expect(score.weatherFalseFlags).toBe(0);
  });

  // Issue 6 targets D ≤ 7 on the simulated fleet (bench/flagsEval.ts). This synthetic data cannot
  // show it: three of its five faults show in their daily figure only a week or more after onset
  // (limit events start 10 days in; heading RMS scatters by 25 % a day, p95_norm by 12 %).
  // Measured here: 18 days, as before the fast path. The bound guards against regressions.
  it('flags within three weeks of onset in the median (measured 18 days)', () => {
    expect(score.medianDetectDays).not.toBeNull();
    expect(score.medianDetectDays!).toBeLessThanOrEqual(20);
  });

  // The fast path (CUSUM confirmed by Kendall, docs/flags.md step 7) flags the faults that show at
  // once — fouling 1 %/day, reference noise 8 %/day — within a week; both slow methods alone took
  // 9–10 days on this fleet.
  it('flags the faults that show at once within 7 days', () => {
    for (const p of score.perEntry.slice(0, 2)) {
      expect(p.delayDays).not.toBeNull();
      expect(p.delayDays!).toBeLessThanOrEqual(7);
    }
  });
});
