/**
 * bench:sim — speed of the demo backfill (seed/demo/backfill.ts): the
 * physics-based simulator (seed/sim/) on worker threads, the records reduced,
 * serialised and batched exactly as `npm run demo -- backfill` publishes them,
 * into a sink that only counts (no broker, no disk). Prints
 * `sim_vessel_days_per_s=N` last.
 *
 * Options: --vessels N (default 12: the whole demo register), --days D
 * (default 60: the target, 60 d × 12 vessels in under 2 minutes),
 * --workers W (default: cores).
 *
 *   npm run bench:sim                          # 60 d × 12 vessels
 *   npm run bench:sim -- --days 5              # a quick look
 */
import { readFileSync } from 'node:fs';
import os from 'node:os';
import { readFleetFile } from '../lib/register/fleetFile';
import { runBackfill } from '../seed/demo/backfill';
import { formatBytes, progressBar } from '../seed/demo/progress';
import { NullSink } from '../seed/demo/sinks';
import { buildPlan, DAY_MS } from '../seed/scenarios/plan';

const TARGET_S = 120;
const T0 = Date.UTC(2026, 0, 1);

function arg(name: string, fallback: number, min = 1): number {
  const i = process.argv.indexOf(`--${name}`);
  const v = i >= 0 ? Number(process.argv[i + 1]) : fallback;
  if (!Number.isFinite(v) || v < min) throw new Error(`--${name} must be a number ≥ ${min}`);
  return v;
}

const all = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
const vessels = Math.min(arg('vessels', 12), all.vessels.length);
const days = arg('days', 60);
const workers = Math.min(arg('workers', os.availableParallelism(), 0), vessels);
const fleet = { ...all, vessels: all.vessels.slice(0, vessels) };
const plan = buildPlan(fleet, 1, T0, days);
const sink = new NullSink();
console.log(`bench:sim backfill of ${vessels} vessel(s) × ${days} day(s) at 1 Hz, one-minute records, on ${workers} worker thread(s) (${os.cpus().length} cores, load ${os.loadavg()[0]!.toFixed(2)})`);

const cpu0 = process.cpuUsage();
const bar = progressBar();
const done = await runBackfill({ fleet, plan, fromMs: T0, toMs: T0 + days * DAY_MS, topicRoot: 'fleet/v1', workers, sink, onProgress: bar.update });
bar.done(done);
const wallS = done.elapsedMs / 1000;
const cpu = process.cpuUsage(cpu0);
const rate = (vessels * days) / wallS;
const cpuS = (cpu.user + cpu.system) / 1e6;
console.log(`${done.records} intervals, ${done.messages} messages, ${formatBytes(done.bytes)} of JSON in ${wallS.toFixed(1)} s wall`);
// Other work on the machine stretches the wall time; the CPU time of all threads says what the run itself cost.
console.log(`CPU time, all threads: ${cpuS.toFixed(1)} s (${((1000 * cpuS) / (vessels * days)).toFixed(0)} ms a vessel-day); load average now ${os.loadavg()[0]!.toFixed(2)}`);
const full = (60 * 12) / rate;
// The workers share the vessels evenly: on `workers` otherwise idle cores the run takes about its CPU time / workers.
const idleS = cpuS / Math.max(1, workers);
console.log(
  vessels === 12 && days === 60
    ? `60 d × 12 vessels: ${wallS.toFixed(1)} s wall (target < ${TARGET_S} s: ${wallS < TARGET_S ? 'met' : 'not met'}); by its CPU time about ${idleS.toFixed(0)} s on ${workers} otherwise idle core(s) (${idleS < TARGET_S ? 'within' : 'beyond'} the target)`
    : `60 d × 12 vessels at this rate: about ${full.toFixed(0)} s wall; by CPU time about ${((idleS * 720) / (vessels * days)).toFixed(0)} s on ${workers} otherwise idle core(s) (target < ${TARGET_S} s; short runs overstate both)`,
);
console.log(`sim_vessel_days_per_s=${rate.toFixed(2)}`);
