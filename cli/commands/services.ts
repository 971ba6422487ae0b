import type { StatusServer } from '../../ingest/statusServer';
import type { Config } from '../../lib/config';
import type { Logger } from '../../lib/log/logger';
import { classifyDatabaseError, retryAtStart } from '../../ingest/startupRetry';
import { ingestWorkerFor, openStore, statusServerFor } from '../runtime';

/**
 * Block until SIGINT or SIGTERM, then run `stop`. Once the handlers are in place it logs that the
 * process is running: from that line on a signal stops it cleanly (before it, the default action
 * would end it at once), so whoever supervises it knows when it is safe to signal.
 */
function untilSignal(stop: () => Promise<void>, log: Logger, what: string): Promise<void> {
  return new Promise((resolve) => {
    const onSignal = () => void stop().finally(resolve);
    process.once('SIGINT', onSignal);
    process.once('SIGTERM', onSignal);
    log.info(`${what} running; SIGINT or SIGTERM stops it cleanly`);
  });
}

function requireSetting(config: Config, name: 'DATABASE_URL' | 'MQTT_URL'): string {
  const value = config[name];
  if (!value) throw new Error(`Setting ${name}: required when running this process on its own`);
  return value;
}

/** `holdfast ingest`: one ingest worker, for production deployments. */
export async function ingestCommand(config: Config, log: Logger): Promise<void> {
  requireSetting(config, 'DATABASE_URL');
  const mqttUrl = requireSetting(config, 'MQTT_URL');
  // A database not there yet is waited for; refused credentials end start-up with one line.
  const store = await retryAtStart(() => openStore(config, log.child('store')), {
    what: 'database',
    setting: 'DATABASE_URL',
    classify: classifyDatabaseError,
    log: log.child('ingest'),
  });
  const worker = ingestWorkerFor(config, store.pool, mqttUrl, log);
  const port = config.HOLDFAST_METRICS_PORT;
  let status: StatusServer | undefined;
  try {
    // Before connecting: a port that cannot be had stops start-up before any message is taken.
    if (port !== 0) status = await statusServerFor(worker, port, log);
    await worker.start();
  } catch (error) {
    await status?.stop();
    await store.close();
    throw error;
  }
  if (status) log.info(`status server on port ${status.port} (all interfaces): /metrics, /healthz`);
  await untilSignal(
    async () => {
      await worker.stop();
      await status?.stop();
      await store.close();
    },
    log,
    'ingest worker',
  );
}

/** `holdfast jobs`: the scheduled job runner, for production deployments. */
export async function jobsCommand(config: Config, log: Logger): Promise<void> {
  requireSetting(config, 'DATABASE_URL');
  const store = await openStore(config, log.child('store'));
  const { startJobRunner } = await import('../../lib/jobs/runner');
  const runner = await startJobRunner({ connectionString: store.url, pool: store.pool, timeZone: config.FLEET_TIME_ZONE, log: log.child('jobs') });
  await untilSignal(
    async () => {
      await runner.stop();
      await store.close();
    },
    log,
    'job runner',
  );
}

/** `holdfast migrate`: bring the store up to date and exit. */
export async function migrateCommand(config: Config, log: Logger): Promise<void> {
  const store = await openStore(config, log.child('store'));
  await store.close();
}
