import type { Pool, PoolClient } from 'pg';

/**
 * The smallest database surface the migration runner and store helpers need.
 * Two implementations: a pg pool client (production and integration tests)
 * and PGlite with TimescaleDB (tests that prove the Timescale flavour).
 */
export interface SqlExecutor {
  /** One statement with bound parameters. */
  query<R = Record<string, unknown>>(sql: string, params?: unknown[]): Promise<{ rows: R[] }>;
  /** A script of several statements, no parameters. */
  exec(sql: string): Promise<void>;
}

export function pgExecutor(client: PoolClient | Pool): SqlExecutor {
  return {
    async query<R>(sql: string, params?: unknown[]) {
      const result = await client.query(sql, params as unknown[] | undefined);
      return { rows: result.rows as R[] };
    },
    async exec(sql: string) {
      await client.query(sql);
    },
  };
}
