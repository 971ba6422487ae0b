import pg from 'pg';

// Return `date` columns as 'YYYY-MM-DD' text: a fleet day is a calendar day,
// not an instant, and converting it to a JS Date would shift it by the
// process's time zone. 1082 is the OID of PostgreSQL's date type.
pg.types.setTypeParser(1082, (value) => value);
// bigint counts (count(*)) fit comfortably in a double for Holdfast's sizes.
pg.types.setTypeParser(20, (value) => Number(value));

export type Pool = pg.Pool;

export interface PoolOptions {
  max?: number;
  /** Give up on a connection attempt after this long (default: wait forever). */
  connectTimeoutMs?: number;
}

export function createPool(connectionString: string, options: PoolOptions | number = {}): pg.Pool {
  const { max = 10, connectTimeoutMs } = typeof options === 'number' ? { max: options } : options;
  const pool = new pg.Pool({
    connectionString,
    max,
    application_name: 'holdfast',
    ...(connectTimeoutMs ? { connectionTimeoutMillis: connectTimeoutMs } : {}),
  });
  // A client losing its connection must not crash the process. pg emits
  // 'error' on the pool for an idle client and on the client itself while
  // it is checked out (the database restarting mid-query) — with no
  // listener there, that ends the process. The query in progress fails with
  // the same error for its caller to handle; the pool discards the broken
  // client when it is released, and the next query reconnects.
  pool.on('error', () => {});
  pool.on('connect', (client) => client.on('error', () => {}));
  return pool;
}
