import type { Config } from '../../lib/config';
import { recomputeDays, type VesselDay } from '../../lib/jobs/dailyRollup';
import type { Logger } from '../../lib/log/logger';
import { daysBetween } from '../../lib/time/dayRange';
import { openStore } from '../runtime';
import { UsageError } from '../usageError';

/**
 * `holdfast jobs run --from DAY --to DAY`: compute the daily figures of every
 * registered vessel for those fleet days now, and return when done — so a
 * script can ingest, compute and read back without waiting for a schedule.
 * Idempotent: running it twice gives the same rows.
 */
export async function jobsRunCommand(config: Config, log: Logger, from: string, to: string): Promise<void> {
  let days: string[];
  try {
    days = daysBetween(from, to);
  } catch (error) {
    throw new UsageError((error as Error).message);
  }
  const store = await openStore(config, log.child('store'));
  try {
    const { rows } = await store.pool.query<{ id: number }>('SELECT id FROM vessel ORDER BY id');
    const work: VesselDay[] = days.flatMap((day) => rows.map((r) => ({ vesselId: r.id, day })));
    const started = Date.now();
    await recomputeDays(store.pool, work, config.FLEET_TIME_ZONE, progress);
    process.stderr.write('\n');
    console.log(
      `computed ${work.length} vessel-day(s): ${rows.length} vessel(s) × ${days.length} day(s) ` +
        `${from}…${to} (${config.FLEET_TIME_ZONE}) in ${((Date.now() - started) / 1000).toFixed(1)} s`,
    );
  } finally {
    await store.close();
  }
}

function progress(done: number, total: number): void {
  const width = 30;
  const filled = total === 0 ? width : Math.round((done / total) * width);
  process.stderr.write(`\r[${'#'.repeat(filled)}${'.'.repeat(width - filled)}] ${done}/${total} vessel-days`);
}
