import type { Pool, PoolClient } from 'pg';

/**
 * Run `work` in one transaction on a client of `pool`: committed when it
 * returns, rolled back when it throws, the client released either way.
 */
export async function inTransaction<T>(pool: Pool, work: (client: PoolClient) => Promise<T>): Promise<T> {
  const client = await pool.connect();
  try {
    await client.query('BEGIN');
    const result = await work(client);
    await client.query('COMMIT');
    return result;
  } catch (error) {
    await client.query('ROLLBACK').catch(() => {});
    throw error;
  } finally {
    client.release();
  }
}
