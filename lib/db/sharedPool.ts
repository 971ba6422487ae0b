import { loadConfig } from '../config';
import { createPool, type Pool } from './pool';

/**
 * The web app's one pg pool, created on first use from `DATABASE_URL`.
 *
 * It lives on `globalThis` so that `next dev`, which re-evaluates modules on
 * every edit, reuses the pool instead of opening a new one each time.
 */

// A connection attempt that hangs (an unroutable host) fails after this long,
// so a page shows its error state instead of waiting forever.
const CONNECT_TIMEOUT_MS = 5_000;

const holder = globalThis as typeof globalThis & { __holdfastSharedPool?: Pool };

export function getSharedPool(): Pool {
  if (holder.__holdfastSharedPool) return holder.__holdfastSharedPool;
  const url = loadConfig().DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: the web app reads the store it names');
  const pool = createPool(url, { connectTimeoutMs: CONNECT_TIMEOUT_MS });
  holder.__holdfastSharedPool = pool;
  return pool;
}
