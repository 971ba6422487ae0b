/**
 * bench:sim — speed of the physics-based demo simulator (seed/sim/):
 * simulated vessel-days per second of wall time, over worker threads (one
 * per core by default), each vessel a job. Prints `sim_vessel_days_per_s=N`
 * last. Options: --vessels N (default 12: one of each type in seed/fleet.json first,
 * then the rest), --days D (default 5), --workers W (default: cores). Short
 * runs understate the rate (worker start-up, JIT warm-up).
 *
 *   npm run bench:sim -- --vessels 12 --days 60      # the 60 d × 12 vessels
 */
import { readFileSync } from 'node:fs';
import os from 'node:os';
import { isMainThread, parentPort, Worker } from 'node:worker_threads';
import { readFleetFile } from '../lib/register/fleetFile';
import { demoSite } from '../seed/sites';
import { VesselSimulator } from '../seed/sim/vesselSimulator';

interface Job {
  index: number;
  days: number;
}

const T0 = Date.UTC(2026, 0, 1);

function runJob(job: Job): { ms: number; intervals: number } {
  const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
  const started = performance.now();
  const sim = new VesselSimulator(fleet.vessels[job.index]!, demoSite(job.index));
  const intervals = job.days * 1440;
  let check = 0;
  for (let k = 0; k < intervals; k++) check += sim.interval(T0 + k * 60_000, 60).station.n;
  if (check !== intervals * 60) throw new Error('lost samples');
  return { ms: performance.now() - started, intervals };
}

function arg(name: string, fallback: number): number {
  const i = process.argv.indexOf(`--${name}`);
  const v = i >= 0 ? Number(process.argv[i + 1]) : fallback;
  if (!Number.isFinite(v) || v <= 0) throw new Error(`--${name} must be a positive number`);
  return v;
}

if (!isMainThread) {
  parentPort!.on('message', (job: Job | null) => {
    if (job === null) return process.exit(0);
    parentPort!.postMessage(runJob(job));
  });
} else {
  const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
  const vessels = Math.min(arg('vessels', 12), fleet.vessels.length);
  const days = arg('days', 5);
  const workers = Math.min(arg('workers', os.availableParallelism()), vessels);
  // One of each type first, then the rest of the register.
  const order: number[] = [];
  const seen = new Set<string>();
  fleet.vessels.forEach((v, i) => {
    if (!seen.has(v.type)) (seen.add(v.type), order.push(i));
  });
  fleet.vessels.forEach((_, i) => {
    if (!order.includes(i)) order.push(i);
  });
  const jobs: Job[] = order.slice(0, vessels).map((index) => ({ index, days }));
  console.log(`bench:sim ${vessels} vessel(s) × ${days} day(s) at 1 Hz on ${workers} worker thread(s) (${os.cpus().length} cores)`);

  const started = performance.now();
  let cpuMs = 0;
  await Promise.all(
    Array.from({ length: workers }, async () => {
      const worker = new Worker(
        // A worker does not inherit tsx's loader: register it, then load this file.
        `import('tsx/esm/api').then((m) => m.register()).then(() => import(${JSON.stringify(import.meta.url)}))`,
        { eval: true },
      );
      try {
        for (let job = jobs.shift(); job; job = jobs.shift()) {
          const current = job;
          const result = await new Promise<{ ms: number; intervals: number }>((resolve, reject) => {
            worker.once('message', resolve);
            worker.once('error', reject);
            worker.postMessage(current);
          });
          cpuMs += result.ms;
          const key = fleet.vessels[current.index]!.key;
          console.log(`  ${key.padEnd(18)} ${current.days} d in ${(result.ms / 1000).toFixed(2)} s (${((current.days * 1000) / result.ms).toFixed(2)} vessel-days/s on one thread)`);
        }
      } finally {
        worker.postMessage(null);
      }
    }),
  );
  const wallS = (performance.now() - started) / 1000;
  const rate = (vessels * days) / wallS;
  console.log(`wall ${wallS.toFixed(2)} s, thread time ${(cpuMs / 1000).toFixed(2)} s`);
  console.log(`60 days × 12 vessels would take about ${((60 * 12) / rate).toFixed(0)} s at this rate`);
  console.log(`sim_vessel_days_per_s=${rate.toFixed(2)}`);
}
