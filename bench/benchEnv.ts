import { randomBytes } from 'node:crypto';
import { mkdtempSync, chmodSync, rmSync } from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import pg from 'pg';
import { startEmbeddedDatabase } from '../lib/db/embedded';
import { pgExecutor } from '../lib/db/executor';
import { migrate } from '../lib/db/migrate';
import { createPool, type Pool } from '../lib/db/pool';

/** True when something accepts TCP connections on host:port. */
export function reachable(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ port, host, timeout: 1_000 });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
    socket.once('timeout', () => {
      socket.destroy();
      resolve(false);
    });
  });
}

export interface BenchDatabase {
  url: string;
  pool: Pool;
  label: string;
  close(): Promise<void>;
}

/**
 * A fresh, migrated database for a benchmark: on BENCH_DATABASE_URL's server,
 * else the machine's PostgreSQL on 127.0.0.1:5432 when it answers, else an
 * embedded one. Dropped by close().
 */
export async function benchDatabase(): Promise<BenchDatabase> {
  let server = process.env.BENCH_DATABASE_URL;
  let stopEmbedded: (() => Promise<void>) | undefined;
  let label = 'given PostgreSQL';
  if (!server && (await reachable(5432))) {
    server = 'postgres://postgres@127.0.0.1:5432/test';
    label = "machine's PostgreSQL";
  }
  if (!server) {
    const dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-bench-pg-'));
    chmodSync(dir, 0o755);
    const db = await startEmbeddedDatabase({ dir: path.join(dir, 'pg'), port: 0, persistent: false });
    server = db.url;
    label = 'embedded PostgreSQL';
    stopEmbedded = async () => {
      await db.stop();
      rmSync(dir, { recursive: true, force: true });
    };
  }
  const name = `hf_bench_${randomBytes(4).toString('hex')}`;
  const admin = new pg.Client({ connectionString: server });
  await admin.connect();
  await admin.query(`CREATE DATABASE ${name}`);
  const u = new URL(server);
  u.pathname = `/${name}`;
  const url = u.toString();
  const pool = createPool(url, 8);
  const client = await pool.connect();
  await migrate(pgExecutor(client), { store: 'partitions' });
  client.release();
  return {
    url,
    pool,
    label,
    async close() {
      await pool.end();
      await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await admin.end();
      await stopEmbedded?.();
    },
  };
}

/** Peak and current resident memory of a process, MB (Linux /proc). */
export async function memoryOf(pid: number): Promise<{ rssMb: number; peakMb: number }> {
  const { readFile } = await import('node:fs/promises');
  const status = await readFile(`/proc/${pid}/status`, 'utf8');
  const kb = (key: string) => Number(new RegExp(`${key}:\\s+(\\d+)`).exec(status)?.[1] ?? 0);
  return { rssMb: kb('VmRSS') / 1024, peakMb: kb('VmHWM') / 1024 };
}

/** CPU seconds (user + system) used so far by a process, or by every process whose command line matches. */
export async function cpuSeconds(match: number | RegExp): Promise<number> {
  const { readFile, readdir } = await import('node:fs/promises');
  const ticks = 100; // USER_HZ on Linux
  const pids = typeof match === 'number' ? [String(match)] : (await readdir('/proc')).filter((p) => /^\d+$/.test(p));
  let total = 0;
  for (const pid of pids) {
    try {
      if (typeof match !== 'number') {
        const cmd = await readFile(`/proc/${pid}/cmdline`, 'utf8');
        if (!match.test(cmd.replaceAll('\0', ' '))) continue;
      }
      const stat = await readFile(`/proc/${pid}/stat`, 'utf8');
      const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
      total += (Number(fields[11]) + Number(fields[12])) / ticks;
    } catch {
      // the process ended meanwhile
    }
  }
  return total;
}
