import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

const NEXT_BIN = path.resolve('node_modules/next/dist/bin/next');
/** What a production build of the web app is made from. */
export const WEB_SOURCES = ['app', 'lib', 'proxy.ts', 'next.config.js', 'package-lock.json'];

/** Newest modification time among files under `paths` (0 when none). */
export function newestMtime(paths: string[]): number {
  let newest = 0;
  const visit = (p: string) => {
    if (!existsSync(p)) return;
    const stat = statSync(p);
    if (stat.isDirectory()) {
      for (const entry of readdirSync(p)) if (entry !== 'generated' && entry !== 'node_modules') visit(path.join(p, entry));
    } else newest = Math.max(newest, stat.mtimeMs);
  };
  paths.forEach(visit);
  return newest;
}

/** True when `distDir` holds a production build newer than every web source. */
export function isBuildFresh(distDir = '.next', root = '.'): boolean {
  const buildId = path.join(root, distDir, 'BUILD_ID');
  return existsSync(buildId) && statSync(buildId).mtimeMs > newestMtime(WEB_SOURCES.map((p) => path.join(root, p)));
}

type Env = Record<string, string | undefined>;

function nextEnv(extra: Env): NodeJS.ProcessEnv {
  return { ...process.env, NEXT_TELEMETRY_DISABLED: '1', ...extra } as NodeJS.ProcessEnv;
}

/** `next build`, output shown; rejects when the build fails. */
export function buildWeb(env: Env = {}): Promise<void> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [NEXT_BIN, 'build'], { stdio: 'inherit', env: nextEnv(env) });
    child.on('exit', (code) => (code === 0 ? resolve() : reject(new Error(`next build failed (exit code ${code})`))));
  });
}

/** `next start` on `port`; the process is the caller's to stop. */
export function startWeb(port: number, env: Env): ChildProcess {
  return spawn(process.execPath, [NEXT_BIN, 'start', '-p', String(port)], {
    stdio: ['ignore', 'inherit', 'inherit'],
    env: nextEnv({ ...env, PORT: String(port) }),
  });
}

/** Resolve once `url` answers HTTP (any status), or reject after `timeoutMs`. */
export async function waitForHttp(url: string, timeoutMs = 60_000): Promise<void> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    try {
      await fetch(url, { signal: AbortSignal.timeout(5_000) });
      return;
    } catch {
      if (Date.now() > deadline) throw new Error(`${url} did not answer within ${timeoutMs / 1000} s`);
      await new Promise((r) => setTimeout(r, 300));
    }
  }
}

/** Ask a child process to stop; kill it if it has not after `graceMs`. */
export function stopChild(child: ChildProcess | undefined, graceMs = 5_000): Promise<void> {
  if (!child || child.exitCode !== null || child.signalCode !== null) return Promise.resolve();
  return new Promise((resolve) => {
    const timer = setTimeout(() => child.kill('SIGKILL'), graceMs);
    child.once('exit', () => {
      clearTimeout(timer);
      resolve();
    });
    child.kill('SIGTERM');
  });
}
