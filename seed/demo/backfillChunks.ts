import type { FleetFile } from '../../lib/register/fleetFile';
import type { ScenarioPlan } from '../scenarios/plan';
import type { SimTexts } from '../sim/vesselSimulator';
import { SimulatedVessel, type Message } from './simulatedVessel';

/** What a backfill producer (a worker thread, or the main thread) simulates. */
export interface BackfillJob {
  fleet: FleetFile;
  plan: ScenarioPlan;
  /** Indices into fleet.vessels this producer owns. */
  vessels: number[];
  /** [fromMs, toMs), whole minutes; one-minute intervals. */
  fromMs: number;
  toMs: number;
  topicRoot: string;
  track: boolean;
}

/** One vessel-day (the last one may be shorter) of messages, in publishing order. */
export interface BackfillChunk {
  day: number;
  vessel: number;
  messages: Message[];
  /** Intervals simulated (those kept back by a link outage included). */
  records: number;
  /** The vessel's final chunk carries whatever its gateway still keeps. */
  last: boolean;
}

export const BACKFILL_DT_S = 60;
const DAY_MS = 86_400_000;

export function backfillDays(fromMs: number, toMs: number): number {
  return Math.max(0, Math.ceil((toMs - fromMs) / DAY_MS));
}

/**
 * The chunks of a job in (day, vessel) order. Each vessel has its own
 * simulator and seed, so which producer owns it changes nothing in its data.
 */
export function* backfillChunks(job: BackfillJob): Generator<BackfillChunk> {
  const days = backfillDays(job.fromMs, job.toMs);
  const vessels = job.vessels.map((i) => new SimulatedVessel(job.fleet.vessels[i]!, i, job.plan, job.topicRoot, { track: job.track }));
  const step = BACKFILL_DT_S * 1000;
  for (let day = 0; day < days; day++) {
    const start = job.fromMs + day * DAY_MS;
    const end = Math.min(job.toMs, start + DAY_MS);
    const lastDay = day === days - 1;
    for (const [k, v] of vessels.entries()) {
      const records: SimTexts[] = [];
      let intervals = 0;
      for (let t = start; t + step <= end; t += step, intervals++) {
        const r = v.next(t, BACKFILL_DT_S);
        if (r) records.push(r);
      }
      const messages = v.batches(records);
      messages.push(...(lastDay ? v.flush() : v.dueReplay(end)));
      yield { day, vessel: job.vessels[k]!, messages, records: intervals, last: lastDay };
    }
  }
}
