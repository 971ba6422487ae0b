import type { Pool } from 'pg';
import { pruneLoginAttempts } from '../auth/loginAttempts';
import { pruneSessions } from '../auth/sessions';

/**
 * The hourly clean-up of sign-in state: sessions that ended (expired or
 * revoked) more than a day ago, and login attempts older than a day. The
 * rate limits look back 15 minutes, so nothing they need is removed; the
 * audit log keeps the record of sign-ins.
 */
export async function pruneAuthState(pool: Pool, now = new Date()): Promise<{ sessions: number; attempts: number }> {
  const sessions = await pruneSessions(pool, now);
  const attempts = await pruneLoginAttempts(pool, now);
  return { sessions, attempts };
}
