/**
 * npm run soak -- --minutes 60 — does memory stay flat with everything
 * running? Starts, each as its own process: a private Mosquitto, one
 * `holdfast ingest`, one `holdfast jobs`, the web app (`next start` on a
 * production build in .holdfast/next-soak) and the demo fleet live at
 * --speed (default 100×) from far enough back that it never catches up with
 * the clock; the store is a fresh database on the machine's PostgreSQL (or
 * BENCH_DATABASE_URL's server, or an embedded one: bench/benchEnv.ts).
 * While it runs it requests the fleet page and a vessel page every
 * --pages seconds as a signed-in fleet manager and samples each process's resident memory (RSS, Linux
 * /proc) every --sample seconds.
 *
 * Warm-up is the first --warmup minutes (default a fifth of the run, at
 * least 2). The baseline is the mean RSS over the minute after warm-up, the
 * end figure the mean over the last minute; growth % compares the two.
 * Target (issue 9): worker and web growth < 10 %. Last line:
 *   soak_minutes=M worker_rss_growth_pct=X web_rss_growth_pct=Y
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { createWriteStream, mkdtempSync, readFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { parseArgs } from 'node:util';
import type { Pool } from 'pg';
import { startWeb, stopChild, waitForHttp } from '../cli/webServer';
import { createPrisma } from '../lib/db/prisma';
import { anyFreePort } from '../lib/net/freePort';
import { readFleetFile } from '../lib/register/fleetFile';
import { importFleet } from '../lib/register/importFleet';
import { buildWebApp } from '../test/helpers/nextServer';
import { benchDatabase, cpuSeconds } from './benchEnv';
import { benchSessionCookie } from './benchSession';
import { processTree } from './processCpu';
import { privateMosquitto } from './privateMosquitto';
import { soakSummary, type RssSample } from './soakSummary';

const { values } = parseArgs({
  options: {
    minutes: { type: 'string', default: '60' },
    speed: { type: 'string', default: '100' },
    sample: { type: 'string', default: '10' },
    pages: { type: 'string', default: '5' },
    warmup: { type: 'string' },
  },
});
const MINUTES = Number(values.minutes);
const SPEED = Number(values.speed);
const SAMPLE_S = Number(values.sample);
const PAGES_S = Number(values.pages);
const WARMUP_MIN = values.warmup !== undefined ? Number(values.warmup) : Math.max(2, MINUTES / 5);
// Its own build directory: a browser test rebuilding .next-test meanwhile would pull the files from under the running server.
const DIST_DIR = '.holdfast/next-soak';
const FLEET_FILE = 'seed/fleet.json';
const TOPIC_ROOT = 'soak/v1';

/** Resident memory of these processes together, MB. */
function rssMb(pids: number[]): number {
  let kb = 0;
  for (const pid of pids) {
    try {
      kb += Number(/VmRSS:\s+(\d+)/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'))?.[1] ?? 0);
    } catch {
      // gone meanwhile
    }
  }
  return kb / 1024;
}

/** Rows the worker has committed, from its own /metrics. */
async function committedRows(metricsPort: number): Promise<number> {
  const text = await (await fetch(`http://127.0.0.1:${metricsPort}/metrics`)).text();
  let rows = 0;
  for (const m of text.matchAll(/^holdfast_ingest_(?:rows_stored|duplicates)_total\{[^}]*\} (\d+)$/gm)) rows += Number(m[1]);
  return rows;
}

async function main(): Promise<void> {
  if (!(MINUTES > WARMUP_MIN + 1)) throw new Error(`--minutes ${MINUTES} leaves no minute after a warm-up of ${WARMUP_MIN}`);
  const logDir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-soak-'));
  const children: ChildProcess[] = [];
  const spawnLogged = (name: string, args: string[], env: Record<string, string>) => {
    const child = spawn(process.execPath, args, { env: { ...process.env, LOG_FORMAT: 'json', ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
    const out = createWriteStream(path.join(logDir, `${name}.log`));
    child.stdout!.pipe(out);
    child.stderr!.pipe(out);
    child.once('exit', (code, signal) => !stopping && console.error(`soak: ${name} exited early (${code ?? signal}); see ${logDir}/${name}.log`));
    children.push(child);
    return child;
  };
  let stopping = false;

  const db = await benchDatabase();
  const broker = await privateMosquitto();
  let web: ChildProcess | undefined;
  try {
    const fleet = readFleetFile(readFileSync(FLEET_FILE, 'utf8'), FLEET_FILE);
    const prisma = createPrisma(db.url);
    await importFleet(prisma, fleet);
    await prisma.$disconnect();
    console.log(`soak: ${MINUTES} min, demo fleet (${fleet.vessels.length} vessels) live at ${SPEED}×, ${db.label}, private Mosquitto; logs in ${logDir}`);

    // With the store named: a page that reads it but is not marked dynamic is rendered at build time, and
    // would fail the build without it (the soak is about memory, not about that page's correctness).
    process.env.DATABASE_URL = db.url;
    const build = await buildWebApp(DIST_DIR);
    console.log(build.skipped ? `next build: reused ${DIST_DIR}` : `next build: ${(build.ms / 1000).toFixed(0)} s (not part of the soak)`);

    const common = { DATABASE_URL: db.url, MQTT_URL: broker.url, MQTT_TOPIC_ROOT: TOPIC_ROOT, LOG_LEVEL: 'info' };
    const metricsPort = await anyFreePort();
    const worker = spawnLogged('ingest', ['bin/holdfast.mjs', 'ingest'], { ...common, MQTT_CLIENT_ID: 'holdfast-soak-ingest', HOLDFAST_METRICS_PORT: String(metricsPort) });
    await waitForHttp(`http://127.0.0.1:${metricsPort}/healthz`);
    const jobs = spawnLogged('jobs', ['bin/holdfast.mjs', 'jobs'], { ...common, HOLDFAST_METRICS_PORT: '0' });
    const webPort = await anyFreePort();
    web = startWeb(webPort, { DATABASE_URL: db.url, HOLDFAST_NEXT_DIST_DIR: DIST_DIR, NODE_ENV: 'production' });
    const webUrl = `http://127.0.0.1:${webPort}`;
    await waitForHttp(webUrl);
    // Simulated time starts far enough back that ×SPEED never reaches the present during the run
    // (the worker refuses records from the future, and at the present the demo drops to real time).
    const startIso = new Date(Date.now() - (MINUTES + 5) * 60_000 * SPEED).toISOString();
    const demo = spawnLogged('demo', ['node_modules/tsx/dist/cli.mjs', 'seed/cli.ts', 'live', '--speed', String(SPEED), '--start', startIso, '--url', broker.url, '--root', TOPIC_ROOT, '--truth', path.join(logDir, 'demo-ground-truth.json')], common);

    // Pages need a session: a fleet manager's, made in the store as sign-in would make it.
    const cookie = await benchSessionCookie(db.pool, 'soak');
    const pages = [`${webUrl}/`, `${webUrl}/vessels/${fleet.vessels[0]!.key}`];
    const pageStats = { ok: 0, redirected: 0, failed: 0, totalMs: 0 };
    const pageTimer = setInterval(() => {
      for (const url of pages) {
        const t0 = performance.now();
        // Redirects not followed: a page answering with the sign-in page would be a soak of the wrong page.
        fetch(url, { headers: { cookie }, redirect: 'manual', signal: AbortSignal.timeout(30_000) })
          .then(async (r) => {
            await r.text();
            if (r.status === 200) pageStats.ok++;
            else if (r.status >= 300 && r.status < 400) pageStats.redirected++;
            else pageStats.failed++;
            pageStats.totalMs += performance.now() - t0;
          })
          .catch(() => pageStats.failed++);
      }
    }, PAGES_S * 1000);

    const cpuBefore = { worker: await cpuSeconds(worker.pid!), jobs: await cpuSeconds(jobs.pid!) };
    const samples: RssSample[] = [];
    const started = Date.now();
    const sample = () => {
      const s: RssSample = {
        atS: (Date.now() - started) / 1000,
        worker: rssMb([worker.pid!]),
        web: rssMb(processTree(web!.pid!)),
        jobs: rssMb([jobs.pid!]),
        demo: rssMb(processTree(demo.pid!)),
      };
      samples.push(s);
      if (samples.length % Math.max(1, Math.round(60 / SAMPLE_S)) === 0) {
        console.log(
          `  ${(s.atS / 60).toFixed(1)} min: RSS worker ${s.worker.toFixed(0)} MB, web ${s.web.toFixed(0)} MB, jobs ${s.jobs.toFixed(0)} MB, demo ${s.demo.toFixed(0)} MB; ` +
            `pages ${pageStats.ok} ok, ${pageStats.redirected} redirected, ${pageStats.failed} failed; load ${os.loadavg()[0]!.toFixed(1)}`,
        );
      }
    };
    sample();
    const sampleTimer = setInterval(sample, SAMPLE_S * 1000);
    await new Promise((r) => setTimeout(r, MINUTES * 60_000));
    clearInterval(sampleTimer);
    clearInterval(pageTimer);
    sample();

    const rows = await committedRows(metricsPort);
    const { rows: daily } = await db.pool.query<{ n: number }>('SELECT count(*)::int AS n FROM daily_vessel');
    const cpu = { worker: (await cpuSeconds(worker.pid!)) - cpuBefore.worker, jobs: (await cpuSeconds(jobs.pid!)) - cpuBefore.jobs };
    const summary = soakSummary(samples, WARMUP_MIN * 60, 60);
    console.log(
      `ingest: ${rows.toLocaleString('en')} rows committed (${Math.round(rows / (MINUTES * 60))} rows/s), worker CPU ${cpu.worker.toFixed(0)} s; ` +
        `jobs: ${daily[0]!.n} vessel-day rows, CPU ${cpu.jobs.toFixed(0)} s; pages: ${pageStats.ok} ok, ${pageStats.redirected} redirected, ${pageStats.failed} failed, ` +
        `mean ${(pageStats.totalMs / Math.max(1, pageStats.ok + pageStats.redirected + pageStats.failed)).toFixed(0)} ms`,
    );
    for (const [name, f] of Object.entries(summary)) {
      console.log(`${name.padEnd(6)} RSS: warm-up end ${f.baselineMb.toFixed(0)} MB, end ${f.endMb.toFixed(0)} MB, peak ${f.peakMb.toFixed(0)} MB, growth ${f.growthPct.toFixed(1)} %`);
    }
    console.log(`machine: ${os.cpus().length} cores, load average at the end ${os.loadavg().map((l) => l.toFixed(1)).join(' ')}`);
    console.log(
      `soak_minutes=${MINUTES} worker_rss_growth_pct=${summary.worker.growthPct.toFixed(1)} web_rss_growth_pct=${summary.web.growthPct.toFixed(1)}`,
    );
  } finally {
    stopping = true;
    await stopChild(web);
    for (const child of children.reverse()) await stopChild(child, 10_000);
    await broker.close();
    await db.close();
  }
}

main().then(
  () => process.exit(0),
  (error) => {
    console.error(error);
    process.exit(1);
  },
);
