/**
 * eval:flags — precision and recall of the trend flags on the demo fleet's
 * seeded faults (issue 6).
 *
 *   1. builds the demo's scenario plan (seed/scenarios/plan.ts) for the whole
 *      fleet (seed/fleet.json) and its ground truth;
 *   2. simulates the history (seed/sim, the demo backfill) and feeds every
 *      message through the ingest worker's own pipeline into a fresh store
 *      (no broker: the same rows, without the broker's CPU on a 2-core box);
 *   3. computes the daily figures of every vessel-day (lib/jobs, as
 *      `holdfast jobs run` does);
 *   4. runs the flag job on every day of the history, oldest first, as the
 *      nightly run would have (lib/jobs/flagJob.ts, default settings unless
 *      --settings FILE);
 *   5. compares the flags with the ground truth (lib/flags/evaluation/score.ts)
 *      and prints, last:
 *        precision=P recall=R median_detect_days=D weather_false_flags=N
 *
 * Options: --days N (default 120: p95_norm needs 49 days of history before it
 * exists, and the faults start at 35–50 % of the history), --seed N (1),
 * --from YYYY-MM-DD (2026-06-01), --workers N (simulator threads, default the
 * cores), --ndjson FILE (replay a file from `npm run demo -- backfill --out`
 * made with the same --days/--seed/--from instead of simulating), --keep
 * (keep the database, named on the first line), --reuse NAME (skip steps
 * 2–3 on a kept database, migrated first; flags are cleared first),
 * --recompute (with --reuse: step 3 again, for daily figures that changed),
 * --settings FILE.json.
 * EVAL_DATABASE_URL chooses the PostgreSQL server (default 127.0.0.1:5432).
 *
 * A full run (12 vessels × 120 days) took 11 minutes on this 2-core machine,
 * nearly all of it simulation and ingest; --reuse takes under a minute.
 * Results: docs/flags.md "Evaluation".
 */
import { randomBytes } from 'node:crypto';
import { readFileSync } from 'node:fs';
import os from 'node:os';
import { parseArgs } from 'node:util';
import { parseFlagSettings } from '../lib/flags/config';
import { scoreFlags, scoreLine, type RaisedFlag } from '../lib/flags/evaluation/score';
import { WATCHED_SERIES, type SeriesKey } from '../lib/flags/series';
import { readSeries } from '../lib/flags/store/readSeries';
import { writeFlagSettings } from '../lib/flags/store/settings';
import { recomputeDays, type VesselDay } from '../lib/jobs/dailyRollup';
import { describeEvaluation, evaluateDays } from '../lib/jobs/flagJob';
import { createLogger } from '../lib/log/logger';
import { readFleetFile } from '../lib/register/fleetFile';
import { addDays } from '../lib/time/fleetDay';
import { daysBetween } from '../lib/time/dayRange';
import { progressBar } from '../seed/demo/progress';
import { groundTruth } from '../seed/scenarios/groundTruth';
import { buildPlan } from '../seed/scenarios/plan';
import { createEvalStore, openEvalStore, type EvalStore } from './flagsEval/evalStore';
import { IngestSink } from './flagsEval/ingestSink';
import { replayInto, simulateInto } from './flagsEval/loadHistory';
import { firstVisibleDay } from './flagsEval/visibility';

const TZ = 'UTC';
const DAY_MS = 86_400_000;

const { values: args } = parseArgs({
  options: {
    days: { type: 'string', default: '120' },
    seed: { type: 'string', default: '1' },
    from: { type: 'string', default: '2026-06-01' },
    workers: { type: 'string', default: String(os.availableParallelism()) },
    ndjson: { type: 'string' },
    keep: { type: 'boolean', default: false },
    reuse: { type: 'string' },
    recompute: { type: 'boolean', default: false },
    settings: { type: 'string' },
  },
});

const seconds = (since: number) => ((Date.now() - since) / 1000).toFixed(0);

async function loadStore(fleet: ReturnType<typeof readFleetFile>, plan: ReturnType<typeof buildPlan>): Promise<EvalStore> {
  const name = `hf_flags_eval_${randomBytes(3).toString('hex')}`;
  const toMs = plan.fromMs + plan.days * DAY_MS;
  const store = await createEvalStore(name, fleet, plan.fromMs - 35 * DAY_MS, toMs + 35 * DAY_MS);
  console.log(`database ${name}${args.keep ? ' (kept: --reuse ' + name + ')' : ''}`);
  const started = Date.now();
  const sink = new IngestSink(store.pool, 'fleet/v1', TZ, createLogger('warn', 'eval'));
  if (args.ndjson) {
    await replayInto(sink, args.ndjson, (n) => process.stderr.write(`\rreplaying ${args.ndjson}: ${n} messages`));
    process.stderr.write('\n');
  } else {
    const bar = progressBar();
    await simulateInto(sink, fleet, plan, Number(args.workers), bar.update);
  }
  await sink.close();
  console.log(`history stored in ${seconds(started)} s (${sink.messages} messages)`);
  await computeDaily(store, plan);
  return store;
}

/** Step 3: the daily figures of every vessel-day of the history. */
async function computeDaily(store: EvalStore, plan: ReturnType<typeof buildPlan>): Promise<void> {
  const toMs = plan.fromMs + plan.days * DAY_MS;
  const computeStart = Date.now();
  const { rows } = await store.pool.query<{ id: number }>('SELECT id FROM vessel ORDER BY id');
  const days = daysBetween(new Date(plan.fromMs).toISOString().slice(0, 10), new Date(toMs - DAY_MS).toISOString().slice(0, 10));
  const work: VesselDay[] = days.flatMap((day) => rows.map((r) => ({ vesselId: r.id, day })));
  await store.pool.query('DELETE FROM dirty_day');
  await recomputeDays(store.pool, work, TZ, (done, total) => process.stderr.write(`\rdaily figures: ${done}/${total} vessel-days`));
  process.stderr.write('\n');
  console.log(`daily figures of ${work.length} vessel-days in ${seconds(computeStart)} s`);
}

async function main(): Promise<void> {
  const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'), 'seed/fleet.json');
  const fromMs = Date.parse(`${args.from}T00:00:00Z`);
  if (!Number.isFinite(fromMs)) throw new Error(`--from: not a day: ${args.from}`);
  const plan = buildPlan(fleet, Number(args.seed) >>> 0, fromMs, Number(args.days));
  const truth = groundTruth(plan);
  console.log(`eval:flags — ${fleet.vessels.length} vessels × ${plan.days} days from ${args.from}, seed ${plan.seed}; ${truth.entries.filter((e) => e.expect_flag).length} faults expected to flag`);

  const store = args.reuse ? await openEvalStore(args.reuse) : await loadStore(fleet, plan);
  if (args.reuse && args.recompute) await computeDaily(store, plan);
  try {
    // The flag job from a clean slate, day by day as the nightly run would have gone.
    await store.pool.query('DELETE FROM flag');
    if (args.settings) await writeFlagSettings(store.pool, JSON.parse(readFileSync(args.settings, 'utf8')));
    else await store.pool.query('DELETE FROM flag_settings');
    const settings = parseFlagSettings(args.settings ? JSON.parse(readFileSync(args.settings, 'utf8')) : {});
    const first = new Date(fromMs).toISOString().slice(0, 10);
    const last = addDays(first, plan.days - 1);
    const evalStart = Date.now();
    const summaries = await evaluateDays(store.pool, daysBetween(addDays(first, settings.minDays - 1), last), TZ);
    console.log(`flag job on ${summaries.length} days in ${seconds(evalStart)} s; last: ${describeEvaluation(summaries.at(-1)!)}`);

    const { rows: flags } = await store.pool.query<RaisedFlag & { method: string; severity: string; explanation: string }>(
      `SELECT v.key AS vessel, f.subject, f.metric, f.opened_day::text AS opened_day, f.method, f.severity, f.explanation
         FROM flag f JOIN vessel v ON v.id = f.vessel_id ORDER BY f.opened_day, f.id`,
    );
    const score = scoreFlags(truth.entries, flags);

    // The diagnostic: when each fault first showed in its daily figure.
    const { rows: vessels } = await store.pool.query<{ id: number; key: string }>('SELECT id, key FROM vessel');
    const { series } = await readSeries(store.pool, vessels.map((v) => v.id), first, last);
    const keyOf = new Map(vessels.map((v) => [v.id, v.key]));
    console.log('\nexpected flags (onset → first outside its pre-onset range → flag opened):');
    for (const p of score.perEntry) {
      const e = p.entry;
      const s = series.find((x) => keyOf.get(x.vesselId) === e.vessel && x.subject === e.subject && x.key === e.metric);
      const visible = s ? firstVisibleDay(s.values, e.onset_date, WATCHED_SERIES[e.metric as SeriesKey].direction) : null;
      const flag = p.flag as (typeof flags)[number] | null;
      console.log(
        `  ${e.scenario.padEnd(17)} ${e.vessel} ${e.subject} ${e.metric}: onset ${e.onset_date} → visible ${visible ?? 'never'} → ` +
          (flag ? `flag ${flag.opened_day} (+${p.delayDays} d, ${flag.method}, ${flag.severity})\n      "${flag.explanation}"` : 'NOT FLAGGED'),
      );
    }
    console.log(`\nflags on a consequence of a fault (right, not required): ${score.consequential.length}`);
    for (const f of score.consequential as typeof flags) console.log(`  ${f.vessel} ${f.subject} ${f.metric} opened ${f.opened_day} (${f.method}): ${f.explanation}`);
    console.log(`\nfalse flags: ${score.falseFlags.length}`);
    for (const f of score.falseFlags as typeof flags) console.log(`  ${f.vessel} ${f.subject} ${f.metric} opened ${f.opened_day} (${f.method}): ${f.explanation}`);
    console.log(`\n${score.correct} of ${score.flags} flags correct; ${score.detected} of ${score.expected} faults flagged`);
    console.log(scoreLine(score));
  } finally {
    await store.close(!args.keep && !args.reuse);
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
