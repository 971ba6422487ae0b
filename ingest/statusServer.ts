import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { Pool } from 'pg';
import type { Logger } from '../lib/log/logger';
import type { IngestMetrics } from '../lib/observability/ingestMetrics';

export interface Health {
  status: 'ok' | 'failing';
  broker: 'connected' | 'disconnected';
  database: 'ok' | 'unreachable';
  /** The parts that fail, when any. */
  failing?: ('broker' | 'database')[];
  /** Why the database check failed. */
  databaseError?: string;
  bufferRows: number;
  unacknowledged: number;
}

/** What the health check looks at: the worker's pool, subscriber and pipeline. */
export interface HealthSources {
  pool: Pick<Pool, 'query'>;
  subscriber: { connected: boolean; unacknowledged: number };
  pipeline: { depth: { rows: number } };
}

/**
 * The worker's health: the broker connection as the subscriber sees it, and
 * the database by `SELECT 1` within `timeoutMs`. The database answer is kept
 * for `cacheMs`, so frequent probes do not each take a connection.
 */
export function ingestHealthCheck(
  sources: HealthSources,
  { timeoutMs = 2_000, cacheMs = 5_000 }: { timeoutMs?: number; cacheMs?: number } = {},
): () => Promise<Health> {
  let cached: { at: number; error?: string } | undefined;
  let checking: Promise<{ at: number; error?: string }> | undefined;
  const checkDatabase = async () => {
    let timer: NodeJS.Timeout | undefined;
    const timeout = new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Error(`no answer within ${timeoutMs} ms`)), timeoutMs);
    });
    try {
      await Promise.race([sources.pool.query('SELECT 1'), timeout]);
      return { at: Date.now() };
    } catch (error) {
      const e = error as Error & { code?: string };
      return { at: Date.now(), error: e.message || e.code || String(error) };
    } finally {
      clearTimeout(timer);
    }
  };
  return async () => {
    if (!cached || Date.now() - cached.at > cacheMs) {
      checking ??= checkDatabase().finally(() => (checking = undefined));
      cached = await checking;
    }
    const broker = sources.subscriber.connected ? 'connected' : 'disconnected';
    const database = cached.error === undefined ? 'ok' : 'unreachable';
    const failing = [...(broker === 'connected' ? [] : ['broker' as const]), ...(database === 'ok' ? [] : ['database' as const])];
    return {
      status: failing.length ? 'failing' : 'ok',
      broker,
      database,
      ...(failing.length ? { failing } : {}),
      ...(cached.error !== undefined ? { databaseError: cached.error } : {}),
      bufferRows: sources.pipeline.depth.rows,
      unacknowledged: sources.subscriber.unacknowledged,
    };
  };
}

export interface StatusServerOptions {
  /** Port to listen on, on every interface (0: any free port). */
  port: number;
  metrics: Pick<IngestMetrics, 'text' | 'contentType'>;
  health: () => Promise<Health>;
  log: Logger;
}

export interface StatusServer {
  port: number;
  stop(): Promise<void>;
}

const json = (res: http.ServerResponse, status: number, body: unknown) => {
  res.writeHead(status, { 'content-type': 'application/json; charset=utf-8', 'cache-control': 'no-store' });
  res.end(JSON.stringify(body));
};

/**
 * The ingest worker's status endpoints, for Prometheus and orchestrators:
 * `GET /metrics` (Prometheus text format) and `GET /healthz` (200 when the
 * broker is connected and the database answers, else 503 naming the part
 * that fails). Listens on all interfaces: a scraper elsewhere must reach it.
 */
export async function startStatusServer(options: StatusServerOptions): Promise<StatusServer> {
  const server = http.createServer((req, res) => {
    const path = (req.url ?? '/').split('?')[0];
    if (req.method !== 'GET' && req.method !== 'HEAD') {
      res.writeHead(405, { allow: 'GET, HEAD' }).end();
      return;
    }
    const answer = async () => {
      if (path === '/metrics') {
        const text = await options.metrics.text();
        res.writeHead(200, { 'content-type': options.metrics.contentType, 'cache-control': 'no-store' });
        res.end(text);
      } else if (path === '/healthz') {
        const health = await options.health();
        json(res, health.status === 'ok' ? 200 : 503, health);
      } else {
        json(res, 404, { error: 'not found; try /metrics or /healthz' });
      }
    };
    answer().catch((error: Error) => {
      options.log.warn(`status server: ${path}: ${error.message}`);
      if (!res.headersSent) json(res, 500, { error: error.message });
      else res.end();
    });
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(options.port, () => {
      server.removeListener('error', reject);
      resolve();
    });
  });
  server.on('error', (error) => options.log.warn(`status server: ${error.message}`));
  const port = (server.address() as AddressInfo).port;
  return {
    port,
    stop: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}
