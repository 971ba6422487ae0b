/**
 * How long a session lives. Source: NIST SP 800-63B (rev. 3, 2017) section
 * 4.2.3, the reauthentication rule of AAL2: at least once per 12 hours of
 * use whatever the activity, and after 30 minutes of inactivity. Holdfast's
 * password-only sign-in is AAL1, whose rule is looser (30 days); the AAL2
 * limits are chosen because the data is commercially sensitive, and a screen
 * left signed in on a shared bridge or office PC should not stay open.
 *
 * A page that refreshes itself counts as activity (each request stamps
 * last_seen_at), so a wall display stays signed in until the 12 hours end.
 */
export const SESSION_LIFETIME_MS = 12 * 3600_000;
export const SESSION_IDLE_MS = 30 * 60_000;
/** last_seen_at is written at most this often per session (a write per request would be wasted). */
export const SESSION_STAMP_EVERY_MS = 60_000;

export interface SessionTimes {
  createdAt: Date;
  expiresAt: Date;
  lastSeenAt: Date;
  revokedAt: Date | null;
}

export type SessionState = 'active' | 'revoked' | 'expired' | 'idle';

/** Whether a stored session still signs its holder in at `now`, and if not, why. */
export function sessionState(session: SessionTimes, now: Date, idleMs = SESSION_IDLE_MS): SessionState {
  if (session.revokedAt !== null && session.revokedAt.getTime() <= now.getTime()) return 'revoked';
  if (now.getTime() >= session.expiresAt.getTime()) return 'expired';
  // The stamp is written at most once a minute, so the idle limit can run up to a minute long.
  if (now.getTime() - session.lastSeenAt.getTime() >= idleMs) return 'idle';
  return 'active';
}

/** True when last_seen_at is old enough to be worth writing again. */
export function shouldStamp(lastSeenAt: Date, now: Date): boolean {
  return now.getTime() - lastSeenAt.getTime() >= SESSION_STAMP_EVERY_MS;
}
