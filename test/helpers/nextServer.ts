import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { isBuildFresh } from '../../cli/webServer';
import { anyFreePort } from '../../lib/net/freePort';

/**
 * Build the web app once into its own directory and run `next start` on it,
 * for end-to-end tests. Builds into `.next-test`, never a developer's `.next`.
 */

export const PROJECT_ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const TEST_DIST_DIR = '.next-test';
const NEXT_BIN = path.join(PROJECT_ROOT, 'node_modules', 'next', 'dist', 'bin', 'next');

function nextEnv(distDir: string, extra: Record<string, string> = {}): NodeJS.ProcessEnv {
  return {
    ...process.env,
    // vitest sets NODE_ENV=test; next wants a production environment here.
    NODE_ENV: 'production',
    NEXT_TELEMETRY_DISABLED: '1',
    HOLDFAST_NEXT_DIST_DIR: distDir,
    HOLDFAST_NEXT_SKIP_TYPECHECK: '1',
    ...extra,
  };
}

function run(args: string[], env: NodeJS.ProcessEnv): Promise<{ code: number | null; output: string }> {
  return new Promise((resolve, reject) => {
    const child = spawn(process.execPath, [NEXT_BIN, ...args], { cwd: PROJECT_ROOT, env, stdio: ['ignore', 'pipe', 'pipe'] });
    let output = '';
    child.stdout.on('data', (d: Buffer) => (output += d.toString()));
    child.stderr.on('data', (d: Buffer) => (output += d.toString()));
    child.once('error', reject);
    child.once('close', (code) => resolve({ code, output }));
  });
}

export interface BuildResult {
  skipped: boolean;
  ms: number;
}

/** `next build` into `distDir`, unless the build there is newer than every source. */
export async function buildWebApp(distDir = TEST_DIST_DIR): Promise<BuildResult> {
  if (isBuildFresh(distDir, PROJECT_ROOT)) return { skipped: true, ms: 0 };
  const started = Date.now();
  const result = await run(['build'], nextEnv(distDir));
  if (result.code !== 0) {
    throw new Error(`next build failed (exit code ${result.code}):\n${result.output.slice(-4000)}`);
  }
  return { skipped: false, ms: Date.now() - started };
}

export interface NextServer {
  url: string;
  /** Everything the server printed so far. */
  output(): string;
  stop(): Promise<void>;
}

function exited(child: ChildProcess): boolean {
  return child.exitCode !== null || child.signalCode !== null;
}

function signalGroup(child: ChildProcess, signal: NodeJS.Signals): void {
  try {
    // The server runs in its own process group (detached): this reaches it
    // and any worker it started, and nothing else.
    process.kill(-child.pid!, signal);
  } catch {
    // Already gone.
  }
}

/**
 * `next start` from `distDir` on a free port, with `env` added (DATABASE_URL
 * and the like). Resolves once the server answers HTTP.
 */
export async function startNextServer(options: {
  env: Record<string, string>;
  distDir?: string;
  timeoutMs?: number;
}): Promise<NextServer> {
  const distDir = options.distDir ?? TEST_DIST_DIR;
  const port = await anyFreePort();
  const url = `http://127.0.0.1:${port}`;
  const child = spawn(process.execPath, [NEXT_BIN, 'start', '-p', String(port), '-H', '127.0.0.1'], {
    cwd: PROJECT_ROOT,
    env: nextEnv(distDir, { ...options.env, PORT: String(port) }),
    stdio: ['ignore', 'pipe', 'pipe'],
    detached: true,
  });
  let output = '';
  child.stdout!.on('data', (d: Buffer) => (output += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (output += d.toString()));

  const server: NextServer = {
    url,
    output: () => output,
    async stop() {
      if (exited(child)) return;
      const gone = new Promise<void>((resolve) => child.once('exit', () => resolve()));
      signalGroup(child, 'SIGTERM');
      const timer = setTimeout(() => signalGroup(child, 'SIGKILL'), 5_000);
      await gone;
      clearTimeout(timer);
    },
  };

  const deadline = Date.now() + (options.timeoutMs ?? 60_000);
  for (;;) {
    if (exited(child)) throw new Error(`next start exited (code ${child.exitCode}) before answering:\n${output}`);
    try {
      await fetch(url, { signal: AbortSignal.timeout(5_000) });
      return server;
    } catch {
      if (Date.now() > deadline) {
        await server.stop();
        throw new Error(`next start did not answer on ${url} in time:\n${output}`);
      }
      await new Promise((r) => setTimeout(r, 200));
    }
  }
}
