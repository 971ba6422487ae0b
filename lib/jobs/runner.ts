import PgBoss from 'pg-boss';
import type { Pool } from 'pg';
import type { Logger } from '../log/logger';
import { addDays, fleetDay } from '../time/fleetDay';
import { recomputeDirtyDays, recomputeFleetDay } from './dailyRollup';
import { maintainPartitions } from './partitionMaintenance';

export interface JobRunnerOptions {
  connectionString: string;
  pool: Pool;
  timeZone: string;
  log: Logger;
}

export interface JobRunner {
  stop(): Promise<void>;
}

/**
 * The scheduled jobs, on pg-boss (a PostgreSQL-backed job queue): its cron
 * schedules are kept in the database and fire once per tick however many
 * runner processes there are, and `singleton` queues never run two jobs of a
 * queue at once.
 *
 *   dirty-days   every minute            recompute days that received records
 *   nightly      00:15 fleet time zone   recompute yesterday for every vessel
 *   partitions   hourly                  partitions ahead, retention
 */
export const JOBS = {
  dirtyDays: { queue: 'holdfast-dirty-days', cron: '* * * * *' },
  nightly: { queue: 'holdfast-nightly', cron: '15 0 * * *' },
  partitions: { queue: 'holdfast-partitions', cron: '7 * * * *' },
} as const;

export async function startJobRunner(options: JobRunnerOptions): Promise<JobRunner> {
  const { pool, timeZone, log } = options;
  const boss = new PgBoss({
    connectionString: options.connectionString,
    schema: 'pgboss',
    max: 4,
    application_name: 'holdfast-jobs',
    // Check the cron table often, so a minute's tick is not missed by much.
    cronMonitorIntervalSeconds: 10,
    cronWorkerIntervalSeconds: 5,
  });
  boss.on('error', (error) => log.warn(`job queue: ${error.message}`));
  await boss.start();

  for (const job of Object.values(JOBS)) {
    await boss.createQueue(job.queue, { name: job.queue, policy: 'singleton', retryLimit: 3, retryDelay: 30, retryBackoff: true });
    await boss.schedule(job.queue, job.cron, {}, { tz: timeZone });
  }

  await boss.work(JOBS.dirtyDays.queue, { pollingIntervalSeconds: 2 }, async () => {
    let total = 0;
    for (;;) {
      const done = await recomputeDirtyDays(pool, timeZone);
      total += done.length;
      if (done.length === 0) break;
    }
    if (total > 0) log.info(`recomputed ${total} dirty vessel-day(s)`);
  });
  await boss.work(JOBS.nightly.queue, { pollingIntervalSeconds: 10 }, async () => {
    const yesterday = addDays(fleetDay(new Date(), timeZone), -1);
    const n = await recomputeFleetDay(pool, yesterday, timeZone);
    log.info(`nightly: computed ${yesterday} for ${n} vessel(s)`);
  });
  await boss.work(JOBS.partitions.queue, { pollingIntervalSeconds: 10 }, async () => {
    const { created, dropped } = await maintainPartitions(pool);
    if (created || dropped.length) log.info(`partitions: ${created} created, ${dropped.length} dropped`);
  });

  // Once now, so a fresh store has its partitions before the first hourly tick.
  await maintainPartitions(pool);
  log.info(`job runner started (fleet time zone ${timeZone})`);

  return {
    stop: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }),
  };
}
