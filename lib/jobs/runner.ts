import PgBoss from 'pg-boss';
import type { Pool } from 'pg';
import type { Logger } from '../log/logger';
import { addDays, fleetDay } from '../time/fleetDay';
import { deliverDue } from '../flags/notify/deliver';
import { recomputeDirtyDays, recomputeFleetDay, type VesselDay } from './dailyRollup';
import { describeEvaluation, evaluateAfterRecompute, evaluateDays } from './flagJob';
import { maintainPartitions } from './partitionMaintenance';
import { pruneAuthState } from './authPrune';

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
 *   dirty-days   every minute            recompute days that received records; then
 *                                        re-evaluate flags of vessels whose changed days
 *                                        lie in yesterday's trend window (lib/jobs/flagJob.ts)
 *   nightly      00:15 fleet time zone   recompute yesterday for every vessel, then
 *                                        evaluate the trend flags of yesterday
 *   webhooks     every minute            send the flag outbox (retries with backoff);
 *                                        also right after a run that opened flags
 *   partitions   hourly                  partitions ahead, retention
 *   auth-prune   hourly                  ended sessions and old login attempts (lib/jobs/authPrune.ts)
 */
export const JOBS = {
  dirtyDays: { queue: 'holdfast-dirty-days', cron: '* * * * *' },
  nightly: { queue: 'holdfast-nightly', cron: '15 0 * * *' },
  webhooks: { queue: 'holdfast-flag-webhooks', cron: '* * * * *' },
  partitions: { queue: 'holdfast-partitions', cron: '7 * * * *' },
  authPrune: { queue: 'holdfast-auth-prune', cron: '37 * * * *' },
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

  // A run that opened flags sends them at once rather than at the next minute's tick.
  const sendSoon = async (opened: number) => {
    if (opened > 0) await boss.send(JOBS.webhooks.queue, {});
  };
  await boss.work(JOBS.dirtyDays.queue, { pollingIntervalSeconds: 2 }, async () => {
    const recomputed: VesselDay[] = [];
    for (;;) {
      const done = await recomputeDirtyDays(pool, timeZone);
      recomputed.push(...done);
      if (done.length === 0) break;
    }
    if (recomputed.length === 0) return;
    log.info(`recomputed ${recomputed.length} dirty vessel-day(s)`);
    const flags = await evaluateAfterRecompute(pool, recomputed, timeZone);
    if (flags) {
      log.info(describeEvaluation(flags));
      await sendSoon(flags.opened.length);
    }
  });
  await boss.work(JOBS.nightly.queue, { pollingIntervalSeconds: 10 }, async () => {
    const yesterday = addDays(fleetDay(new Date(), timeZone), -1);
    const n = await recomputeFleetDay(pool, yesterday, timeZone);
    log.info(`nightly: computed ${yesterday} for ${n} vessel(s)`);
    const [flags] = await evaluateDays(pool, [yesterday], timeZone);
    log.info(describeEvaluation(flags!));
    await sendSoon(flags!.opened.length);
  });
  await boss.work(JOBS.webhooks.queue, { pollingIntervalSeconds: 5 }, async () => {
    const sent = await deliverDue(pool);
    if (sent.attempted > 0) log.info(`flag webhooks: ${sent.delivered} delivered, ${sent.failed} failed (retried later)`);
  });
  await boss.work(JOBS.partitions.queue, { pollingIntervalSeconds: 10 }, async () => {
    const { created, dropped } = await maintainPartitions(pool);
    if (created || dropped.length) log.info(`partitions: ${created} created, ${dropped.length} dropped`);
  });

  await boss.work(JOBS.authPrune.queue, { pollingIntervalSeconds: 30 }, async () => {
    const pruned = await pruneAuthState(pool);
    if (pruned.sessions || pruned.attempts) log.info(`sign-in state: ${pruned.sessions} ended session(s), ${pruned.attempts} old login attempt(s) removed`);
  });

  // Once now, so a fresh store has its partitions before the first hourly tick.
  await maintainPartitions(pool);
  log.info(`job runner started (fleet time zone ${timeZone})`);

  return {
    stop: () => boss.stop({ graceful: true, wait: true, timeout: 10_000 }),
  };
}
