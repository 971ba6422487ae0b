import { writeAudit } from './audit';
import type { Queryable } from './db';
import { beginLoginAttempt, settleLoginAttempt } from './loginAttempts';
import { DEFAULT_SCRYPT, dummyPasswordHash, hashPassword, needsRehash, verifyPassword, type ScryptParams } from './password';
import type { UserPrincipal } from './principal';
import { accountKey, addressKey, LOGIN_RATE_LIMIT, type RateLimitPolicy } from './rateLimitPolicy';
import { isRole } from './roles';
import { createSession, readSession, revokeAllSessions, revokeSession, type NewSession } from './sessions';

/**
 * Sign-in, sign-out and sign-out everywhere, each one call for the web
 * layer, each audited.
 *
 * Every refusal looks the same to the caller ("invalid"): unknown address,
 * wrong password, disabled user and a user without a password alike, and
 * all take one password check's time, so neither the answer nor its timing
 * tells which addresses have accounts (OWASP Authentication Cheat Sheet,
 * "Authentication and Error Messages"). The audit log records the real
 * reason. Only the rate limit is told apart, with how long to wait.
 */

export interface SignInRequest {
  email: string;
  password: string;
  /** The client's address as the web layer determined it (for the limit and the record). */
  ip?: string | null;
  userAgent?: string | null;
}

export type SignInResult =
  | ({ kind: 'ok'; principal: UserPrincipal } & NewSession)
  | { kind: 'invalid' }
  | { kind: 'limited'; retryAfterS: number };

export interface SignInOptions {
  now?: Date;
  scrypt?: ScryptParams;
  rateLimit?: RateLimitPolicy;
}

interface UserRow {
  id: number;
  email: string;
  role: string;
  organisation_id: number | null;
  password_hash: string | null;
  disabled_at: Date | null;
}

export async function signIn(db: Queryable, request: SignInRequest, options: SignInOptions = {}): Promise<SignInResult> {
  const now = options.now ?? new Date();
  const email = accountKey(request.email);
  const ip = request.ip?.trim() || null;
  const attempt = await beginLoginAttempt(db, { email, addressKey: addressKey(ip), now }, options.rateLimit ?? LOGIN_RATE_LIMIT);
  if (!attempt.decision.allowed) return { kind: 'limited', retryAfterS: attempt.decision.retryAfterS };

  const { rows } = await db.query<UserRow>(
    'SELECT id, email, role, organisation_id, password_hash, disabled_at FROM app_user WHERE lower(email) = $1',
    [email],
  );
  const user = rows[0];
  const params = options.scrypt ?? DEFAULT_SCRYPT;
  // Always one password check, against a dummy hash when there is nothing real to check.
  const matches = await verifyPassword(request.password, user?.password_hash ?? (await dummyPasswordHash(params)));
  const refusal = !user ? 'unknown_user' : !user.password_hash ? 'no_password' : !matches ? 'wrong_password' : user.disabled_at ? 'disabled' : !isRole(user.role) ? 'unknown_role' : null;

  if (refusal || !user || !isRole(user.role)) {
    await settleLoginAttempt(db, attempt.id, 'failure');
    await writeAudit(db, {
      actor: user ? { kind: 'anonymous', label: user.email } : { kind: 'anonymous', label: email || 'anonymous' },
      action: 'auth.sign_in_failed',
      subject: email,
      ip,
      detail: { reason: refusal ?? 'unknown_role' },
    });
    return { kind: 'invalid' };
  }

  await settleLoginAttempt(db, attempt.id, 'success');
  const session = await createSession(db, user.id, { now, ip, userAgent: request.userAgent });
  // Parameters raised since this hash was made: store a new hash now that the password is at hand.
  const rehash = needsRehash(user.password_hash!, params) ? await hashPassword(request.password, params) : null;
  await db.query('UPDATE app_user SET last_sign_in_at = $2, password_hash = coalesce($3, password_hash) WHERE id = $1', [user.id, now, rehash]);
  const principal: UserPrincipal = { kind: 'user', userId: user.id, email: user.email, role: user.role, organisationId: user.organisation_id };
  await writeAudit(db, { actor: principal, action: 'auth.sign_in', subject: user.email, ip, detail: { rehashed: rehash !== null } });
  return { kind: 'ok', principal, ...session };
}

/** Sign out of the session of this cookie. */
export async function signOut(db: Queryable, sessionId: string, context: { ip?: string | null; now?: Date } = {}): Promise<void> {
  const now = context.now ?? new Date();
  const session = await readSession(db, sessionId, now);
  if (!(await revokeSession(db, sessionId, now))) return;
  if (session.ok) await writeAudit(db, { actor: session.principal, action: 'auth.sign_out', subject: session.principal.email, ip: context.ip });
}

/** Sign out everywhere: every session of the signed-in user ends, this one included. */
export async function signOutEverywhere(db: Queryable, principal: UserPrincipal, context: { ip?: string | null; now?: Date } = {}): Promise<number> {
  const revoked = await revokeAllSessions(db, principal.userId, { now: context.now });
  await writeAudit(db, { actor: principal, action: 'auth.sign_out_everywhere', subject: principal.email, ip: context.ip, detail: { sessionsRevoked: revoked } });
  return revoked;
}
