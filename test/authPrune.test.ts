import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { hashSessionId } from '../lib/auth/sessionId';
import { createSession, readSession } from '../lib/auth/sessions';
import { createUser } from '../lib/auth/users';
import { pruneAuthState } from '../lib/jobs/authPrune';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';

/**
 * The hourly clean-up job's work (lib/jobs/authPrune.ts): sessions that
 * ended more than a day ago and login attempts older than a day go; a live
 * session, a session ended an hour ago and recent attempts (the rate limits
 * count the last 15 minutes) stay.
 */
describe('pruning sign-in state', () => {
  let db: TestDatabase;
  beforeAll(async () => {
    db = await createMigratedDatabase();
  });
  afterAll(async () => db?.drop());

  it('removes what ended more than a day ago and keeps the rest', async () => {
    const now = new Date('2026-06-01T12:00:00Z');
    const hoursAgo = (h: number) => new Date(now.getTime() - h * 3600_000);
    const { id: userId } = await createUser(
      db.pool,
      { email: 'prune@tests.holdfast.example', displayName: 'Prune test', role: 'shore_engineer', password: 'a long and unusual pass phrase 7' },
      { actor: { kind: 'system' }, scrypt: { ln: 10, r: 8, p: 1 } },
    );
    const live = await createSession(db.pool, userId, { now: hoursAgo(0.1) }); // 6 minutes ago: within the idle limit
    const expiredLongAgo = await createSession(db.pool, userId, { now: hoursAgo(40) }); // ended at 28 h ago
    const revokedRecently = await createSession(db.pool, userId, { now: hoursAgo(3) });
    const revokedLongAgo = await createSession(db.pool, userId, { now: hoursAgo(30) });
    await db.pool.query(`UPDATE user_session SET revoked_at = $2 WHERE id_hash = $1`, [hashSessionId(revokedRecently.sessionId), hoursAgo(2)]);
    await db.pool.query(`UPDATE user_session SET revoked_at = $2 WHERE id_hash = $1`, [hashSessionId(revokedLongAgo.sessionId), hoursAgo(29)]);
    for (const h of [0.1, 5, 23, 25, 48]) {
      await db.pool.query(`INSERT INTO login_attempt (at, email, ip_key, outcome) VALUES ($1, 'x@tests.holdfast.example', '127.0.0.1', 'failure')`, [hoursAgo(h)]);
    }
    const { rows: before } = await db.pool.query('SELECT count(*)::int AS n FROM user_session');
    expect(before[0].n).toBe(4);

    expect(await pruneAuthState(db.pool, now)).toEqual({ sessions: 2, attempts: 2 });
    const { rows: left } = await db.pool.query('SELECT count(*)::int AS n FROM user_session');
    expect(left[0].n).toBe(2);
    expect((await readSession(db.pool, live.sessionId, now)).ok).toBe(true);
    expect((await readSession(db.pool, expiredLongAgo.sessionId, now)).ok).toBe(false);
    const { rows: attempts } = await db.pool.query('SELECT count(*)::int AS n FROM login_attempt');
    expect(attempts[0].n).toBe(3);
    // Run again: nothing more to do (the job is idempotent).
    expect(await pruneAuthState(db.pool, now)).toEqual({ sessions: 0, attempts: 0 });
  });
});
