/**
 * bench:web — server response times of the fleet page and a vessel page on a
 * large store, measured in the same run that builds it.
 *
 * Generates 500 vessels × 365 days of daily rows (each vessel with 6
 * thrusters, 2 switchboards and 3 reference systems: about 2.2 million rows
 * over daily_vessel, daily_thruster, daily_ref and daily_bus; 150 live trend
 * flags; a station record per vessel) with the browser tests' generator
 * (test/e2e/fixtures/dailyFigures.ts), builds the web app (or reuses a fresh
 * build in .next-test), starts `next start` on it, warms each page up, then
 * times BENCH_REQUESTS (default 60) sequential GETs of each page, to the last
 * byte of the body, signed in as a fleet manager.
 *
 * Prints p50 / p95 / max per page and, last,
 * `fleet_p95_ms=N vessel_p95_ms=M`. Targets (issue 7): fleet < 150 ms,
 * vessel < 300 ms.
 *
 *   npm run bench:web          BENCH_DATABASE_URL=… to choose the server
 *                              BENCH_WEB_REUSE_URL=… to time an already loaded database again
 */
import { addDays, fleetDay } from '../lib/time/fleetDay';
import os from 'node:os';
import { startWeb, stopChild, waitForHttp } from '../cli/webServer';
import { anyFreePort } from '../lib/net/freePort';
import { buildWebApp, TEST_DIST_DIR } from '../test/helpers/nextServer';
import { cpuSeconds, processTree } from './processCpu';
import { createPool } from '../lib/db/pool';
import { benchDatabase, type BenchDatabase } from './benchEnv';
import { benchSessionCookie } from './benchSession';
import { loadWebBenchFleet } from './webFleet';

const VESSELS = Number(process.env.BENCH_VESSELS ?? 500);
const DAYS = Number(process.env.BENCH_DAYS ?? 365);
const REQUESTS = Math.max(50, Number(process.env.BENCH_REQUESTS ?? 60));
const WARMUP = 10;

const seconds = (since: bigint) => Number(process.hrtime.bigint() - since) / 1e9;

function percentile(sorted: number[], q: number): number {
  // Nearest rank: the smallest value with at least q of the samples at or below it.
  return sorted[Math.min(sorted.length - 1, Math.ceil(q * sorted.length) - 1)]!;
}

async function timeRequests(url: string, n: number, cookie: string): Promise<number[]> {
  const times: number[] = [];
  for (let i = 0; i < n; i++) {
    const start = process.hrtime.bigint();
    // Not following redirects: a page answering with the sign-in page is an error here, not a time.
    const response = await fetch(url, { headers: { cookie }, redirect: 'manual' });
    await response.text();
    if (response.status !== 200) throw new Error(`${url}: HTTP ${response.status}`);
    times.push(seconds(start) * 1000);
  }
  return times.sort((a, b) => a - b);
}

/** BENCH_WEB_REUSE_URL: measure a database an earlier run loaded (kept, not dropped) instead of loading a new one. */
async function database(): Promise<BenchDatabase> {
  const reuse = process.env.BENCH_WEB_REUSE_URL;
  if (!reuse) return benchDatabase();
  const pool = createPool(reuse, 4);
  return { url: reuse, pool, label: 'given, already loaded database', close: () => pool.end() };
}

async function main(): Promise<void> {
  const db = await database();
  let stop: (() => Promise<void>) | undefined;
  try {
    const today = fleetDay(new Date(), 'UTC');
    const from = addDays(today, -(DAYS - 1));
    console.log(`bench:web on ${db.label}: ${VESSELS} vessels × ${DAYS} days (${from} to ${today})`);

    if (!process.env.BENCH_WEB_REUSE_URL) {
      const loadStart = process.hrtime.bigint();
      const rows = await loadWebBenchFleet(db.pool, {
        vessels: VESSELS,
        from,
        to: today,
        onProgress: (v, n) => process.stderr.write(`\rloading: ${v}/${VESSELS} vessels, ${n.toLocaleString('en')} daily rows`),
      });
      process.stderr.write('\n');
      await db.pool.query('VACUUM ANALYZE');
      console.log(`loaded ${rows.toLocaleString('en')} daily rows in ${seconds(loadStart).toFixed(1)} s (not timed below)`);
    }

    const build = await buildWebApp();
    console.log(build.skipped ? 'next build: reused .next-test' : `next build: ${(build.ms / 1000).toFixed(1)} s`);
    const port = await anyFreePort();
    const child = startWeb(port, { DATABASE_URL: db.url, FLEET_TIME_ZONE: 'UTC', HOLDFAST_NEXT_DIST_DIR: TEST_DIST_DIR, PORT: String(port) });
    stop = () => stopChild(child);
    const base = `http://127.0.0.1:${port}`;
    await waitForHttp(base);
    const cookie = await benchSessionCookie(db.pool, `web-${process.pid}`);

    const pages = [
      { name: 'fleet', url: `${base}/` },
      { name: 'vessel', url: `${base}/vessels/bench-0042` },
      { name: 'vessel_365d', url: `${base}/vessels/bench-0042?days=365` },
    ];
    const p95: Record<string, number> = {};
    for (const page of pages) {
      await timeRequests(page.url, WARMUP, cookie);
      // The web server and the database backends it opened, for CPU per request.
      const { rows: backends } = await db.pool.query<{ pid: number }>(
        `SELECT pid FROM pg_stat_activity WHERE datname = current_database() AND pid <> pg_backend_pid()`,
      );
      const pids = [...processTree(child.pid!), ...backends.map((b) => b.pid)];
      const cpuBefore = cpuSeconds(pids);
      const load = os.loadavg()[0]!;
      const times = await timeRequests(page.url, REQUESTS, cookie);
      const cpuAfter = cpuSeconds(pids);
      p95[page.name] = percentile(times, 0.95);
      const cpu = cpuBefore !== null && cpuAfter !== null ? `, CPU ${(((cpuAfter - cpuBefore) * 1000) / REQUESTS).toFixed(0)} ms per request (web server + its database backends)` : '';
      console.log(
        `${page.name.padEnd(12)} ${REQUESTS} requests: p50 ${percentile(times, 0.5).toFixed(1)} ms, p95 ${p95[page.name]!.toFixed(1)} ms, max ${times.at(-1)!.toFixed(1)} ms${cpu}; load average ${load.toFixed(1)} on ${os.cpus().length} cores`,
      );
    }
    console.log('targets: fleet p95 < 150 ms, vessel p95 < 300 ms (vessel_365d is for information)');
    console.log(`fleet_p95_ms=${Math.round(p95.fleet!)} vessel_p95_ms=${Math.round(p95.vessel!)}`);
  } finally {
    await stop?.();
    await db.close();
  }
}

main().catch((error) => {
  console.error(error);
  process.exit(1);
});
