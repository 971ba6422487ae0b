import { parentPort, workerData } from 'node:worker_threads';
import { backfillChunks, type BackfillJob } from './backfillChunks';

/**
 * A backfill worker thread: simulates its vessels day by day and posts each
 * vessel-day's messages to the main thread, at most CREDITS ahead of what the
 * main thread has published (memory stays bounded however slow the sink).
 */
export const CREDITS = 3;

const port = parentPort!;
let credits = CREDITS;
let wake: (() => void) | undefined;
port.on('message', (m: unknown) => {
  if (m === 'credit') {
    credits++;
    wake?.();
  }
});

for (const chunk of backfillChunks(workerData as BackfillJob)) {
  while (credits === 0) await new Promise<void>((resolve) => (wake = resolve));
  credits--;
  port.postMessage(chunk);
}
port.postMessage('done');
