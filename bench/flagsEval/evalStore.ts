import pg from 'pg';
import { pgExecutor } from '../../lib/db/executor';
import { migrate } from '../../lib/db/migrate';
import { createPool, type Pool } from '../../lib/db/pool';
import { createPrisma } from '../../lib/db/prisma';
import type { FleetFile } from '../../lib/register/fleetFile';
import { importFleet } from '../../lib/register/importFleet';

/**
 * The evaluation's store: a database of its own on a PostgreSQL server
 * (EVAL_DATABASE_URL's, else the machine's on 127.0.0.1:5432), migrated,
 * with the demo fleet imported and partitions for the simulated history.
 * Kept when asked (`--keep`), so flags can be re-evaluated on the same daily
 * figures without simulating again (`--reuse NAME`).
 */
export interface EvalStore {
  name: string;
  url: string;
  pool: Pool;
  close(drop: boolean): Promise<void>;
}

const serverUrl = () => process.env.EVAL_DATABASE_URL ?? 'postgres://postgres@127.0.0.1:5432/postgres';

function urlOf(name: string): string {
  const u = new URL(serverUrl());
  u.pathname = `/${name}`;
  return u.toString();
}

async function admin<T>(body: (client: pg.Client) => Promise<T>): Promise<T> {
  const client = new pg.Client({ connectionString: serverUrl() });
  await client.connect();
  try {
    return await body(client);
  } finally {
    await client.end();
  }
}

function storeOf(name: string): EvalStore {
  const url = urlOf(name);
  const pool = createPool(url, 6);
  return {
    name,
    url,
    pool,
    async close(drop) {
      await pool.end();
      if (drop) await admin((c) => c.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`));
    },
  };
}

/** A new database `name` (identifier checked), migrated, fleet imported, partitions over [fromMs, toMs). */
export async function createEvalStore(name: string, fleet: FleetFile, fromMs: number, toMs: number): Promise<EvalStore> {
  if (!/^[a-z_][a-z0-9_]{0,62}$/.test(name)) throw new Error(`database name "${name}": lower-case letters, digits and _ only`);
  await admin((c) => c.query(`CREATE DATABASE ${name}`));
  const store = await migrated(name);
  const prisma = createPrisma(store.url);
  try {
    await importFleet(prisma, fleet);
  } finally {
    await prisma.$disconnect();
  }
  await store.pool.query(`SELECT holdfast_ensure_partitions(table_name, $1::timestamptz, $2::timestamptz) FROM holdfast_retention`, [
    new Date(fromMs).toISOString(),
    new Date(toMs).toISOString(),
  ]);
  return store;
}

/** An existing evaluation database, as left by `--keep`, brought up to date with the migrations. */
export async function openEvalStore(name: string): Promise<EvalStore> {
  const exists = await admin((c) => c.query('SELECT 1 FROM pg_database WHERE datname = $1', [name]));
  if (exists.rowCount === 0) throw new Error(`no database "${name}" on ${serverUrl()}`);
  return migrated(name);
}

/** The store of database `name`, with every migration applied (the plain-partitions flavour). */
async function migrated(name: string): Promise<EvalStore> {
  const store = storeOf(name);
  const client = await store.pool.connect();
  try {
    await migrate(pgExecutor(client), { store: 'partitions' });
  } finally {
    client.release();
  }
  return store;
}
