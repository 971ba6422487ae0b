import os from 'node:os';
import type { FleetFile } from '../../lib/register/fleetFile';
import type { Logger } from '../../lib/log/logger';
import { writeGroundTruth } from '../scenarios/groundTruth';
import { runBackfill } from './backfill';
import { demoPlan } from './history';
import { LivePublisher } from './live';
import { formatBytes } from './progress';
import type { Sink } from './sinks';

export interface SupervisedDemoOptions {
  fleet: FleetFile;
  seed: number;
  /** History length of the scenario plan, days; also what is backfilled. */
  days: number;
  /** Backfill the history (the store has no telemetry yet). */
  backfill: boolean;
  intervalS: number;
  topicRoot: string;
  sink: Sink;
  /** Where the ground truth is kept (and read back on the next start). */
  truthFile: string;
  /** Messages the ingest worker has committed so far: the backfill keeps at most PACE_WINDOW ahead of it. */
  committed?: () => number;
  log: Logger;
}

/** Messages the backfill may run ahead of what the ingest worker has committed (bounds the broker's queue). */
const PACE_WINDOW = 40;
/** …unless the count has not moved for this long (the worker may be one of a shared group): go on. */
const PACE_PATIENCE_MS = 10_000;

/**
 * The demo of `holdfast start`: live telemetry from now on at once, and, into
 * a store without telemetry, the history backfilled in the background (a
 * worker thread simulates, this thread publishes at the ingest worker's
 * pace, progress in the log).
 */
export function startSupervisedDemo(o: SupervisedDemoOptions): { stop: () => Promise<void>; backfilled: Promise<void> } {
  const now = Date.now();
  const { plan, resumed } = demoPlan(o.fleet, o.seed, o.days, now, o.backfill ? undefined : o.truthFile);
  if (!resumed) writeGroundTruth(o.truthFile, plan);
  o.log.info(`demo scenarios ${resumed ? 'continue' : 'start'} from ${new Date(plan.fromMs).toISOString().slice(0, 10)} (seed ${o.seed}); ground truth: ${o.truthFile}`);

  const liveFrom = Math.floor(now / 60_000) * 60_000;
  const live = new LivePublisher({
    fleet: o.fleet,
    plan,
    sink: o.sink,
    topicRoot: o.topicRoot,
    intervalS: o.intervalS,
    fromMs: liveFrom,
    onError: (e) => o.log.warn(`demo publish failed: ${e.message}`),
  });
  live.start();

  const abort = new AbortController();
  let backfilled = Promise.resolve();
  if (o.backfill && o.days > 0) {
    let lastTenth = -1;
    const started = Date.now();
    backfilled = runBackfill({
      fleet: o.fleet,
      plan,
      fromMs: plan.fromMs,
      toMs: liveFrom,
      topicRoot: o.topicRoot,
      workers: Math.max(1, os.availableParallelism() - 1),
      sink: o.sink,
      pace: o.committed ? paceWith(o.sink, o.committed) : undefined,
      signal: abort.signal,
      onProgress: (p) => {
        const tenth = Math.floor((10 * p.vesselDays) / p.totalVesselDays);
        if (tenth > lastTenth && tenth > 0 && tenth < 10) {
          lastTenth = tenth;
          o.log.info(`demo history: ${tenth * 10} % (${p.vesselDays}/${p.totalVesselDays} vessel-days, ${formatBytes(p.bytes)} published)`);
        }
      },
    }).then(
      (p) => o.log.info(`demo history published: ${p.records} intervals of ${o.fleet.vessels.length} vessels over ${o.days} day(s), ${p.messages} messages in ${((Date.now() - started) / 1000).toFixed(0)} s`),
      (e: Error) => {
        if (!abort.signal.aborted) o.log.warn(`demo history: ${e.message}`);
      },
    );
  }

  return {
    backfilled,
    async stop() {
      abort.abort();
      await live.stop();
      await backfilled;
    },
  };
}

/** Wait while more than PACE_WINDOW published messages are not yet committed (and the count moves). */
function paceWith(sink: Sink, committed: () => number): () => Promise<void> {
  return async () => {
    let last = committed();
    let since = Date.now();
    while (sink.messages - committed() > PACE_WINDOW) {
      await new Promise((resolve) => setTimeout(resolve, 50));
      const c = committed();
      if (c !== last) {
        last = c;
        since = Date.now();
      } else if (Date.now() - since > PACE_PATIENCE_MS) return;
    }
  };
}
