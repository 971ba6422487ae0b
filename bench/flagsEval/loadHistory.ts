import { createReadStream } from 'node:fs';
import readline from 'node:readline';
import type { FleetFile } from '../../lib/register/fleetFile';
import { runBackfill, type BackfillProgress } from '../../seed/demo/backfill';
import type { ScenarioPlan } from '../../seed/scenarios/plan';
import type { Sink } from '../../seed/demo/sinks';

/**
 * The simulated history into a sink: simulated now (the demo's own
 * backfill, faults as `plan` says), or replayed from an NDJSON file written
 * earlier by `npm run demo -- backfill --out FILE` with the same plan.
 */

export async function simulateInto(sink: Sink, fleet: FleetFile, plan: ScenarioPlan, workers: number, onProgress: (p: BackfillProgress) => void): Promise<void> {
  const toMs = plan.fromMs + plan.days * 86_400_000;
  await runBackfill({ fleet, plan, fromMs: plan.fromMs, toMs, topicRoot: 'fleet/v1', track: false, workers, sink, onProgress });
}

export async function replayInto(sink: Sink, file: string, onProgress: (messages: number) => void): Promise<void> {
  const lines = readline.createInterface({ input: createReadStream(file), crlfDelay: Infinity });
  let n = 0;
  for await (const line of lines) {
    if (!line.trim()) continue;
    const { topic, payload } = JSON.parse(line) as { topic: string; payload: unknown };
    await sink.publish(topic, typeof payload === 'string' ? payload : JSON.stringify(payload));
    if (++n % 50 === 0) onProgress(n);
  }
  onProgress(n);
}
