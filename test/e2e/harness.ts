import { createHash } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { createApiToken } from '../../lib/api/tokens';
import type { Pool } from '../../lib/db/pool';
import { launchChromium, type TestBrowser } from '../helpers/browser';
import { createMigratedDatabase, type TestDatabase } from '../helpers/db';
import { buildWebApp, PROJECT_ROOT, startNextServer, type NextServer } from '../helpers/nextServer';
import { loadDemoFleet, type DemoFleet } from './fixtures/demoFleet';
import type { Role } from '../../lib/auth/roles';
import { signInBrowser, type SignedIn } from './signIn';

/**
 * What the browser tests share: one production build of the web app for the
 * whole run, screenshots in one place, and an API token to compare pages
 * with the API.
 *
 * One build: vitest runs test files in parallel processes, and each browser
 * test file needs the build. The first to arrive takes a lock (an atomic
 * mkdir beside the system's temp files, keyed by project folder) and builds;
 * the others wait for the lock and then find the build fresh
 * (buildWebApp skips it). A lock left by a killed run is taken over after
 * STALE_LOCK_MS.
 */

const LOCK = path.join(os.tmpdir(), `holdfast-next-build-${createHash('sha256').update(PROJECT_ROOT).digest('hex').slice(0, 12)}.lock`);
const STALE_LOCK_MS = 10 * 60_000;

async function withBuildLock<T>(body: () => Promise<T>): Promise<T> {
  for (;;) {
    try {
      mkdirSync(LOCK);
      break;
    } catch (error) {
      if ((error as NodeJS.ErrnoException).code !== 'EEXIST') throw error;
      try {
        if (Date.now() - statSync(LOCK).mtimeMs > STALE_LOCK_MS) rmSync(LOCK, { recursive: true, force: true });
      } catch {
        // Released meanwhile.
      }
      await new Promise((r) => setTimeout(r, 500));
    }
  }
  try {
    return await body();
  } finally {
    rmSync(LOCK, { recursive: true, force: true });
  }
}

/**
 * Which test run last checked the build: the vitest main process, parent of
 * every test file's worker process. Within one run the build is checked
 * once; a source edited while the run goes on does not start a second build
 * under servers that are using the first.
 */
const RUN_MARK = `${LOCK}.run`;
/** The parent's pid and, on Linux, its start time (a pid alone can come back in a later run). */
function runId(): string {
  try {
    const stat = readFileSync(`/proc/${process.ppid}/stat`, 'utf8');
    return `${process.ppid}:${stat.slice(stat.lastIndexOf(')') + 2).split(' ')[19]}`;
  } catch {
    return String(process.ppid);
  }
}
const thisRun = runId();

/** The shared build: built by the first test file that needs it, reused by every other. */
export async function sharedBuild(): Promise<void> {
  await withBuildLock(async () => {
    if (existsSync(RUN_MARK) && readFileSync(RUN_MARK, 'utf8') === thisRun) {
      console.info('next build: checked earlier in this run');
      return;
    }
    const result = await buildWebApp();
    writeFileSync(RUN_MARK, thisRun);
    console.info(result.skipped ? 'next build: reused .next-test' : `next build: ${(result.ms / 1000).toFixed(1)} s`);
  });
}

/** `next start` on the shared build against `databaseUrl`, in the fleet time zone given. */
export function startWeb(databaseUrl: string, timeZone = 'UTC'): Promise<NextServer> {
  return startNextServer({ env: { DATABASE_URL: databaseUrl, FLEET_TIME_ZONE: timeZone } });
}

/** Screenshots of each page go here (ignored by git: /tmp/ in .gitignore). */
export const ARTIFACTS = path.join(PROJECT_ROOT, 'tmp', 'test-artifacts', 'screenshots');

export async function screenshot(page: Page, name: string): Promise<void> {
  mkdirSync(ARTIFACTS, { recursive: true });
  await page.screenshot({ path: path.join(ARTIFACTS, `${name}.png`), fullPage: true });
}

export async function adminToken(pool: Pool): Promise<string> {
  return (await createApiToken(pool, { name: 'browser tests', role: 'admin' })).token;
}

/** GET an API path with a bearer token; JSON body. */
export async function apiJson<T>(server: NextServer, token: string, apiPath: string): Promise<T> {
  const response = await fetch(`${server.url}/api/v1${apiPath}`, { headers: { authorization: `Bearer ${token}` } });
  if (response.status !== 200) throw new Error(`GET ${apiPath}: ${response.status} ${await response.text()}`);
  return (await response.json()) as T;
}

/** Waits until client components have hydrated (charts drawn, forms wired). */
export async function hydrated(page: Page): Promise<void> {
  await page.waitForLoadState('networkidle');
}

/** Everything a browser test file works with: Chromium, the demo fleet in its own database, a server on the shared build. */
export interface DemoSite {
  browser: TestBrowser;
  db: TestDatabase;
  server: NextServer;
  demo: DemoFleet;
  /** An admin API token, to compare pages with the API. */
  token: string;
  /** The user the browser is signed in as. */
  user: SignedIn;
  close(): Promise<void>;
}

/**
 * `role`: who the browser is signed in as (an admin unless said otherwise,
 * so every screen is open to it); the session cookie is put into the
 * browser before the first page.
 */
export async function openDemoSite(options: { timeZone?: string; browserTimeZone?: string; role?: Role } = {}): Promise<DemoSite> {
  // Chromium first, so that a machine without it fails at once and says why.
  const browser = await launchChromium({ timezoneId: options.browserTimeZone });
  const db = await createMigratedDatabase();
  const demo = await loadDemoFleet(db, options.timeZone);
  const token = await adminToken(db.pool);
  await sharedBuild();
  const server = await startWeb(db.url, options.timeZone);
  const user = await signInBrowser(browser.context, server, db.pool, options.role ?? 'admin');
  return {
    browser,
    db,
    server,
    demo,
    token,
    user,
    async close() {
      await browser.close();
      await server.stop();
      await db.drop();
    },
  };
}
