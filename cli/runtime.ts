import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { mkdir } from 'node:fs/promises';
import path from 'node:path';
import pg from 'pg';
import type { Config } from '../lib/config';
import { pgExecutor } from '../lib/db/executor';
import { migrate } from '../lib/db/migrate';
import { createPool, type Pool } from '../lib/db/pool';
import type { Logger } from '../lib/log/logger';
import { startStatusServer, type StatusServer } from '../ingest/statusServer';
import { IngestWorker } from '../ingest/worker';

/**
 * Where the running `holdfast start` left its embedded services, so that other
 * commands (`holdfast fleet import`, …) reach the same store while it runs.
 */
export interface RuntimeFile {
  pid: number;
  databaseUrl: string;
  mqttUrl: string;
  webUrl?: string;
}

const runtimePath = (config: Config) => path.resolve(config.HOLDFAST_DATA_DIR, 'runtime.json');

export function writeRuntimeFile(config: Config, runtime: RuntimeFile): void {
  mkdirSync(config.HOLDFAST_DATA_DIR, { recursive: true });
  writeFileSync(runtimePath(config), JSON.stringify(runtime, null, 2));
}

export function removeRuntimeFile(config: Config): void {
  rmSync(runtimePath(config), { force: true });
}

/** The runtime file of a `holdfast start` that is still alive, if any. */
export function readRuntimeFile(config: Config): RuntimeFile | undefined {
  const file = runtimePath(config);
  if (!existsSync(file)) return undefined;
  try {
    const runtime = JSON.parse(readFileSync(file, 'utf8')) as RuntimeFile;
    process.kill(runtime.pid, 0); // throws when that process is gone
    return runtime;
  } catch {
    return undefined;
  }
}

export interface Store {
  url: string;
  pool: Pool;
  embedded: boolean;
  close(): Promise<void>;
}

const EMBEDDED_DATABASE = 'holdfast';

/**
 * The store a command works on: DATABASE_URL when set; else the embedded
 * database of a running `holdfast start`; else the embedded database started
 * here (and stopped by `close`). Migrations are applied before returning.
 */
export async function openStore(config: Config, log: Logger): Promise<Store> {
  let url = config.DATABASE_URL ?? readRuntimeFile(config)?.databaseUrl;
  let stopEmbedded: (() => Promise<void>) | undefined;
  if (!url) {
    await mkdir(config.HOLDFAST_DATA_DIR, { recursive: true });
    const { startEmbeddedDatabase } = await import('../lib/db/embedded');
    const embedded = await startEmbeddedDatabase({
      dir: path.join(config.HOLDFAST_DATA_DIR, 'pg'),
      port: config.HOLDFAST_EMBEDDED_PG_PORT,
      log: (line) => log.info(line),
    });
    stopEmbedded = embedded.stop;
    url = await ensureDatabase(embedded.url, EMBEDDED_DATABASE);
    log.info(`embedded PostgreSQL on 127.0.0.1:${embedded.port} (data in ${path.join(config.HOLDFAST_DATA_DIR, 'pg')})`);
  }
  const pool = createPool(url);
  try {
    await migrateStore(pool, config, log);
  } catch (error) {
    await pool.end();
    await stopEmbedded?.();
    throw error;
  }
  return {
    url,
    pool,
    embedded: stopEmbedded !== undefined,
    async close() {
      await pool.end();
      await stopEmbedded?.();
    },
  };
}

async function migrateStore(pool: Pool, config: Config, log: Logger) {
  const client = await pool.connect();
  try {
    await migrate(pgExecutor(client), { store: config.HOLDFAST_STORE, log: (line) => log.info(line) });
  } finally {
    client.release();
  }
}

/** Create `name` on the server behind `serverUrl` if missing; its URL. */
async function ensureDatabase(serverUrl: string, name: string): Promise<string> {
  const client = new pg.Client({ connectionString: serverUrl });
  await client.connect();
  try {
    const exists = await client.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]);
    if (exists.rowCount === 0) await client.query(`CREATE DATABASE ${name}`);
  } finally {
    await client.end();
  }
  const u = new URL(serverUrl);
  u.pathname = `/${name}`;
  return u.toString();
}

/** An ingest worker configured from the settings, on `pool`, reading `mqttUrl`. */
export function ingestWorkerFor(config: Config, pool: Pool, mqttUrl: string, log: Logger): IngestWorker {
  return new IngestWorker({
    pool,
    mqttUrl,
    mqttUsername: config.MQTT_USERNAME,
    mqttPassword: config.MQTT_PASSWORD,
    clientId: config.MQTT_CLIENT_ID,
    topicRoot: config.MQTT_TOPIC_ROOT,
    sharedGroup: config.MQTT_SHARED_GROUP,
    fleetTimeZone: config.FLEET_TIME_ZONE,
    log: log.child('ingest'),
    batchRows: config.INGEST_BATCH_ROWS,
    bufferRows: Math.max(config.INGEST_BUFFER_ROWS, config.INGEST_BATCH_ROWS),
  });
}

/** The worker's /metrics and /healthz on `port` (all interfaces). */
export async function statusServerFor(worker: IngestWorker, port: number, log: Logger): Promise<StatusServer> {
  try {
    return await startStatusServer({ port, metrics: worker.metrics, health: worker.health, log });
  } catch (error) {
    const e = error as NodeJS.ErrnoException;
    if (e.code === 'EADDRINUSE' || e.code === 'EACCES') {
      throw new Error(`Setting HOLDFAST_METRICS_PORT: cannot listen on port ${port} (${e.code}); choose another, or 0 to turn the status server off`);
    }
    throw error;
  }
}
