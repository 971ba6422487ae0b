import type { Pool } from 'pg';

/** One statement at a time: a pool or a client inside a transaction. */
export type Queryable = Pick<Pool, 'query'>;

/** For changes that must land together (revoke the old credential and store the new one). */
export { inTransaction } from '../db/transaction';
