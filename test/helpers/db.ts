import { randomBytes } from 'node:crypto';
import { inject } from 'vitest';
import { pgExecutor } from '../../lib/db/executor';
import { migrate } from '../../lib/db/migrate';
import type { StoreFlavour } from '../../lib/db/migrationFiles';
import { createPool, type Pool } from '../../lib/db/pool';

export interface TestDatabase {
  url: string;
  pool: Pool;
  drop(): Promise<void>;
}

function withDatabase(url: string, database: string): string {
  const u = new URL(url);
  u.pathname = `/${database}`;
  return u.toString();
}

/** A new, empty database on the test server, dropped by `drop()`. */
export async function createTestDatabase(): Promise<TestDatabase> {
  const serverUrl = inject('databaseUrl');
  const name = `hf_test_${randomBytes(5).toString('hex')}`;
  const admin = createPool(serverUrl, 1);
  await admin.query(`CREATE DATABASE ${name}`);
  const url = withDatabase(serverUrl, name);
  const pool = createPool(url, 5);
  return {
    url,
    pool,
    async drop() {
      await pool.end();
      await admin.query(`DROP DATABASE IF EXISTS ${name} WITH (FORCE)`);
      await admin.end();
    },
  };
}

/** A new database migrated to the current schema (plain PostgreSQL flavour). */
export async function createMigratedDatabase(store: StoreFlavour | 'auto' = 'partitions'): Promise<TestDatabase> {
  const db = await createTestDatabase();
  const client = await db.pool.connect();
  try {
    await migrate(pgExecutor(client), { store });
  } finally {
    client.release();
  }
  return db;
}
