import { csrfTokenFor } from './csrf';
import type { Queryable } from './db';
import type { UserPrincipal } from './principal';
import { isRole } from './roles';
import { hashSessionId, newSessionId, SESSION_ID_PATTERN } from './sessionId';
import { SESSION_LIFETIME_MS, sessionState, shouldStamp, type SessionState } from './sessionPolicy';

/**
 * Sessions in the store (user_session): created at sign-in, read on every
 * request, revoked at sign-out, all of a user's at once by "sign out
 * everywhere", a password change or disabling the user.
 */

export interface NewSession {
  /** The cookie value; shown to the browser once, stored only as its hash. */
  sessionId: string;
  csrfToken: string;
  expiresAt: Date;
}

export async function createSession(
  db: Queryable,
  userId: number,
  context: { now?: Date; ip?: string | null; userAgent?: string | null } = {},
): Promise<NewSession> {
  const now = context.now ?? new Date();
  const sessionId = newSessionId();
  const expiresAt = new Date(now.getTime() + SESSION_LIFETIME_MS);
  await db.query(
    `INSERT INTO user_session (id_hash, user_id, created_at, expires_at, last_seen_at, ip, user_agent)
     VALUES ($1, $2, $3, $4, $3, $5, $6)`,
    [hashSessionId(sessionId), userId, now, expiresAt, context.ip?.slice(0, 64) ?? null, context.userAgent?.slice(0, 512) ?? null],
  );
  return { sessionId, csrfToken: csrfTokenFor(sessionId), expiresAt };
}

export type SessionCheck =
  | { ok: true; principal: UserPrincipal; csrfToken: string; expiresAt: Date }
  | { ok: false; reason: 'malformed' | 'unknown' | 'user_disabled' | Exclude<SessionState, 'active'> };

interface SessionRow {
  created_at: Date;
  expires_at: Date;
  last_seen_at: Date;
  revoked_at: Date | null;
  user_id: number;
  email: string;
  role: string;
  organisation_id: number | null;
  disabled_at: Date | null;
}

/**
 * Who the cookie `sessionId` signs in at `now`, or why it does not. Stamps
 * last_seen_at (at most once a minute) when the session is still good.
 * The user's role and organisation are read afresh each time, so a change
 * to them applies to the next request.
 */
export async function readSession(db: Queryable, sessionId: string | null | undefined, now = new Date()): Promise<SessionCheck> {
  // A value that cannot be a session id is refused without a database round trip.
  if (!sessionId || !SESSION_ID_PATTERN.test(sessionId)) return { ok: false, reason: 'malformed' };
  const idHash = hashSessionId(sessionId);
  const { rows } = await db.query<SessionRow>(
    `SELECT s.created_at, s.expires_at, s.last_seen_at, s.revoked_at,
            u.id AS user_id, u.email, u.role, u.organisation_id, u.disabled_at
       FROM user_session s JOIN app_user u ON u.id = s.user_id
      WHERE s.id_hash = $1`,
    [idHash],
  );
  const row = rows[0];
  if (!row) return { ok: false, reason: 'unknown' };
  const state = sessionState({ createdAt: row.created_at, expiresAt: row.expires_at, lastSeenAt: row.last_seen_at, revokedAt: row.revoked_at }, now);
  if (state !== 'active') return { ok: false, reason: state };
  if (row.disabled_at !== null || !isRole(row.role)) return { ok: false, reason: 'user_disabled' };
  if (shouldStamp(row.last_seen_at, now)) {
    // Conditional, so concurrent requests of one session write it once.
    await db.query('UPDATE user_session SET last_seen_at = $2 WHERE id_hash = $1 AND last_seen_at < $2', [idHash, now]);
  }
  return {
    ok: true,
    principal: { kind: 'user', userId: row.user_id, email: row.email, role: row.role, organisationId: row.organisation_id },
    csrfToken: csrfTokenFor(sessionId),
    expiresAt: row.expires_at,
  };
}

/** Sign out: revoke this one session. False when there was no such live session. */
export async function revokeSession(db: Queryable, sessionId: string, now = new Date()): Promise<boolean> {
  if (!SESSION_ID_PATTERN.test(sessionId)) return false;
  const { rowCount } = await db.query('UPDATE user_session SET revoked_at = $2 WHERE id_hash = $1 AND revoked_at IS NULL', [hashSessionId(sessionId), now]);
  return rowCount === 1;
}

/**
 * Sign out everywhere: revoke every live session of a user, optionally
 * keeping the one the request came from (after a password change the user
 * stays signed in where they changed it). Returns how many were revoked.
 */
export async function revokeAllSessions(db: Queryable, userId: number, options: { except?: string; now?: Date } = {}): Promise<number> {
  const keep = options.except && SESSION_ID_PATTERN.test(options.except) ? hashSessionId(options.except) : null;
  const { rowCount } = await db.query(
    `UPDATE user_session SET revoked_at = $3
      WHERE user_id = $1 AND revoked_at IS NULL AND ($2::text IS NULL OR id_hash <> $2)`,
    [userId, keep, options.now ?? new Date()],
  );
  return rowCount ?? 0;
}

/** Delete sessions that ended more than a day ago (a job may call it; nothing needs them). */
export async function pruneSessions(db: Queryable, now = new Date()): Promise<number> {
  const before = new Date(now.getTime() - 24 * 3600_000);
  const { rowCount } = await db.query('DELETE FROM user_session WHERE expires_at < $1 OR revoked_at < $1', [before]);
  return rowCount ?? 0;
}
