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
    for (const p of score.perEntry) console.log(`${p.entry.scenario} ${p.entry.metric}: ${p.delayDays === null ? 'not flagged' : `+${p.delayDays} d`}`);
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

  // Issue 6's target, D ≤ 7. Three of the five faults show in their figure from onset (fouling
  // 1 %/day, reference noise 8 %/day, the generator derating's step) and open by the fast path
  // (docs/flags.md step 7); the detune's p95_norm and heading RMS scatter by 12 % and 25 % a day
  // and take two to three weeks. Measured on seeds 6–12: 5–6 days, no false flag.
  it('flags within a week of onset in the median (target D ≤ 7; measured 6 days)', () => {
    expect(score.medianDetectDays).not.toBeNull();
    expect(score.medianDetectDays!).toBeLessThanOrEqual(7);
  });

  it('flags each fault that shows at once within 7 days', () => {
    const fast = score.perEntry.filter((p) => ['thruster_fouling', 'reference_noise', 'generator_derate'].includes(p.entry.scenario));
    expect(fast).toHaveLength(3);
    for (const p of fast) {
      expect(p.delayDays).not.toBeNull();
      expect(p.delayDays!).toBeLessThanOrEqual(7);
    }
  });
});
