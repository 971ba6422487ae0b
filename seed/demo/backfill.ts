import { Worker } from 'node:worker_threads';
import type { FleetFile } from '../../lib/register/fleetFile';
import type { ScenarioPlan } from '../scenarios/plan';
import { backfillChunks, backfillDays, type BackfillChunk, type BackfillJob } from './backfillChunks';
import type { Sink } from './sinks';

export interface BackfillProgress {
  vesselDays: number;
  totalVesselDays: number;
  messages: number;
  records: number;
  bytes: number;
  elapsedMs: number;
}

export interface BackfillOptions {
  fleet: FleetFile;
  plan: ScenarioPlan;
  /** [fromMs, toMs): whole minutes. */
  fromMs: number;
  toMs: number;
  topicRoot: string;
  /** Also publish the 1 Hz track stream (86,400 records a vessel-day). */
  track?: boolean;
  /** Worker threads simulating vessels (0: simulate on this thread). */
  workers: number;
  sink: Sink;
  /** Awaited before each message (back-pressure from a consumer). */
  pace?: () => Promise<void>;
  onProgress?: (p: BackfillProgress) => void;
  signal?: AbortSignal;
}

/**
 * Simulate and publish the history of the whole fleet as fast as the sink
 * takes it: vessels spread over worker threads (each vessel keeps its own
 * simulator, so the data do not depend on the thread count), messages sent in
 * a fixed order — day by day, vessels in register order — so that the output
 * is the same for the same seed. Every stream of a vessel-day goes out as
 * `records` batches (store-and-forward shape); a link outage's backlog
 * follows when its replay time has come.
 */
export async function runBackfill(o: BackfillOptions): Promise<BackfillProgress> {
  const started = performance.now();
  const n = o.fleet.vessels.length;
  const days = backfillDays(o.fromMs, o.toMs);
  const progress: BackfillProgress = { vesselDays: 0, totalVesselDays: days * n, messages: 0, records: 0, bytes: 0, elapsedMs: 0 };
  const job = (vessels: number[]): BackfillJob => ({ fleet: o.fleet, plan: o.plan, vessels, fromMs: o.fromMs, toMs: o.toMs, topicRoot: o.topicRoot, track: o.track ?? false });
  const publish = async (chunk: BackfillChunk) => {
    for (const m of chunk.messages) {
      if (o.signal?.aborted) throw new Error('backfill stopped');
      await o.pace?.();
      await o.sink.publish(m.topic, m.payload);
      progress.messages++;
      progress.bytes += m.payload.length;
    }
    progress.records += chunk.records;
    progress.vesselDays++;
    progress.elapsedMs = performance.now() - started;
    o.onProgress?.(progress);
  };

  const threads = Math.min(Math.max(0, Math.floor(o.workers)), n);
  if (threads === 0) {
    for (const chunk of backfillChunks(job(o.fleet.vessels.map((_, i) => i)))) {
      await publish(chunk);
      // Let the event loop breathe between vessel-days (timers, sockets).
      await new Promise((resolve) => setImmediate(resolve));
    }
    return progress;
  }

  const producers = Array.from({ length: threads }, (_, w) => new Producer(job(o.fleet.vessels.map((_, i) => i).filter((i) => i % threads === w))));
  const stop = () => producers.forEach((p) => p.fail(new Error('backfill stopped')));
  o.signal?.addEventListener('abort', stop);
  try {
    for (let day = 0; day < days; day++) {
      for (let i = 0; i < n; i++) {
        const producer = producers[i % threads]!;
        const chunk = await producer.take(day, i);
        await publish(chunk);
        producer.credit();
      }
    }
    return progress;
  } finally {
    o.signal?.removeEventListener('abort', stop);
    await Promise.all(producers.map((p) => p.close()));
  }
}

/** A worker thread running backfillWorker.ts on one job, its chunks taken in order. */
class Producer {
  private readonly worker: Worker;
  private readonly ready: BackfillChunk[] = [];
  private waiting?: { resolve: (c: BackfillChunk) => void; reject: (e: Error) => void };
  private error?: Error;

  constructor(job: BackfillJob) {
    const url = new URL('./backfillWorker.ts', import.meta.url).href;
    // A worker does not inherit the TypeScript loader: register tsx there first, then load the worker.
    this.worker = new Worker(`import('tsx/esm/api').then((m) => m.register()).then(() => import(${JSON.stringify(url)}))`, { eval: true, workerData: job });
    this.worker.on('message', (m: BackfillChunk | 'done') => {
      if (m === 'done') return;
      if (this.waiting) {
        const w = this.waiting;
        this.waiting = undefined;
        w.resolve(m);
      } else this.ready.push(m);
    });
    this.worker.on('error', (e) => this.fail(e));
    this.worker.on('exit', (code) => {
      if (code !== 0) this.fail(new Error(`backfill worker exited with code ${code}`));
    });
  }

  take(day: number, vessel: number): Promise<BackfillChunk> {
    const check = (c: BackfillChunk) => {
      if (c.day !== day || c.vessel !== vessel) throw new Error(`backfill: expected day ${day} vessel ${vessel}, got day ${c.day} vessel ${c.vessel}`);
      return c;
    };
    if (this.error) return Promise.reject(this.error);
    const next = this.ready.shift();
    if (next) return Promise.resolve(check(next));
    return new Promise((resolve, reject) => (this.waiting = { resolve: (c) => resolve(check(c)), reject }));
  }

  credit(): void {
    this.worker.postMessage('credit');
  }

  fail(e: Error): void {
    this.error ??= e;
    const w = this.waiting;
    this.waiting = undefined;
    w?.reject(this.error);
  }

  async close(): Promise<void> {
    this.error ??= new Error('closed');
    await this.worker.terminate();
  }
}
