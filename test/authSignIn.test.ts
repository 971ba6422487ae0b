import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readAudit } from '../lib/auth/audit';
import { checkCsrf, csrfTokenFor } from '../lib/auth/csrf';
import { createPool, type Pool } from '../lib/db/pool';
import type { ScryptParams } from '../lib/auth/password';
import { verifyPassword } from '../lib/auth/password';
import { LOGIN_RATE_LIMIT } from '../lib/auth/rateLimitPolicy';
import { hashSessionId } from '../lib/auth/sessionId';
import { readSession, revokeSession } from '../lib/auth/sessions';
import { signIn, signOut, signOutEverywhere } from '../lib/auth/signIn';
import { createUser, disableUser, setUserPassword } from '../lib/auth/users';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { uniqueSuffix } from './helpers/fleet';

/**
 * Sign-in, sessions, rate limits and CSRF against a real PostgreSQL: issue 8
 * "must show 3" at the library level (rate limiting, CSRF rejection, session
 * expiry; token revocation is in authTokens.test.ts).
 */

// Cheap scrypt parameters: these tests are about the flow; lib/auth/password.test.ts checks the real ones.
const FAST: ScryptParams = { ln: 10, r: 8, p: 1 };
const PASSWORD = 'grey seas at first light';
const T0 = new Date('2026-03-01T08:00:00Z');
const minutes = (n: number) => new Date(T0.getTime() + n * 60_000);
const APP = 'https://holdfast.example.com';

describe('sign-in and sessions', () => {
  let db: TestDatabase;
  const s = uniqueSuffix();
  const email = (name: string) => `${name}-${s}@example.com`;
  let engineerId: number;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const created = await createUser(
      db.pool,
      { email: email('Engineer'), displayName: 'Ingrid Solberg', role: 'shore_engineer', password: PASSWORD },
      { actor: { kind: 'cli' }, scrypt: FAST },
    );
    engineerId = created.id;
  });
  afterAll(async () => db?.drop());

  const attempt = (who: string, password: string, now: Date, ip: string | null = '198.51.100.7') =>
    signIn(db.pool, { email: who, password, ip, userAgent: 'vitest' }, { now, scrypt: FAST });

  it('signs in with the right password: a session whose cookie value the store never sees, and an audit entry', async () => {
    const result = await attempt(email('engineer').toUpperCase(), PASSWORD, T0);
    expect(result.kind).toBe('ok');
    if (result.kind !== 'ok') return;
    expect(result.principal).toMatchObject({ kind: 'user', userId: engineerId, role: 'shore_engineer', organisationId: null });
    expect(result.expiresAt).toEqual(minutes(12 * 60));
    const { rows } = await db.pool.query('SELECT * FROM user_session WHERE user_id = $1', [engineerId]);
    expect(rows.map((r) => r.id_hash)).toContain(hashSessionId(result.sessionId));
    expect(JSON.stringify(rows)).not.toContain(result.sessionId);
    const user = await db.pool.query('SELECT last_sign_in_at, password_hash FROM app_user WHERE id = $1', [engineerId]);
    expect(user.rows[0].last_sign_in_at).toEqual(T0);
    expect(await verifyPassword(PASSWORD, user.rows[0].password_hash)).toBe(true);
    const audit = await readAudit(db.pool, { action: 'auth.sign_in' });
    expect(audit[0]).toMatchObject({ actorUserId: engineerId, subject: email('engineer'), ip: '198.51.100.7' });

    const check = await readSession(db.pool, result.sessionId, minutes(1));
    expect(check).toMatchObject({ ok: true, principal: { userId: engineerId }, csrfToken: result.csrfToken });
  });

  it('refuses an unknown address, a wrong password and a disabled user with the same answer, and records why', async () => {
    const other = await createUser(
      db.pool,
      { email: email('leaver'), displayName: 'Leaver', role: 'fleet_manager', password: PASSWORD },
      { actor: { kind: 'cli' }, scrypt: FAST },
    );
    expect(await disableUser(db.pool, email('leaver'), { actor: { kind: 'cli' } })).toBe(true);
    expect(await attempt(email('nobody'), PASSWORD, minutes(2), '203.0.113.1')).toEqual({ kind: 'invalid' });
    expect(await attempt(email('engineer'), `${PASSWORD}!`, minutes(2), '203.0.113.1')).toEqual({ kind: 'invalid' });
    expect(await attempt(email('leaver'), PASSWORD, minutes(2), '203.0.113.1')).toEqual({ kind: 'invalid' });
    const reasons = (await readAudit(db.pool, { action: 'auth.sign_in_failed' })).map((a) => [a.subject, a.detail.reason]);
    expect(reasons.slice(0, 3).reverse()).toEqual([
      [email('nobody'), 'unknown_user'],
      [email('engineer'), 'wrong_password'],
      [email('leaver'), 'disabled'],
    ]);
    expect(other.id).toBeGreaterThan(engineerId);
  });

  it('rate-limits one account: the 11th try in 15 minutes is refused unchecked, even with the right password', async () => {
    const who = email('target');
    await createUser(db.pool, { email: who, displayName: 'Target', role: 'admin', password: PASSWORD }, { actor: { kind: 'cli' }, scrypt: FAST });
    const start = minutes(100);
    for (let i = 0; i < LOGIN_RATE_LIMIT.perAccount; i++) {
      // From ten different addresses: the account limit does not depend on where the tries come from.
      expect(await attempt(who, 'wrong guess number one', new Date(start.getTime() + i * 1000), `192.0.2.${i + 1}`)).toEqual({ kind: 'invalid' });
    }
    const limited = await attempt(who, PASSWORD, new Date(start.getTime() + 10_000), '192.0.2.99');
    expect(limited).toEqual({ kind: 'limited', retryAfterS: 890 });
    const outcomes = await db.pool.query('SELECT outcome, count(*)::int AS n FROM login_attempt WHERE email = $1 GROUP BY outcome ORDER BY outcome', [who]);
    expect(outcomes.rows).toEqual([
      { outcome: 'failure', n: 10 },
      { outcome: 'limited', n: 1 },
    ]);
    // Once the first failure has left the window, one more try is checked, and the right password works.
    expect((await attempt(who, PASSWORD, new Date(start.getTime() + 900_001), '192.0.2.99')).kind).toBe('ok');
    // A success starts the account's count again.
    expect(await attempt(who, 'wrong again', new Date(start.getTime() + 900_002), '192.0.2.99')).toEqual({ kind: 'invalid' });
  });

  it('rate-limits one address spraying many accounts, and only that address', async () => {
    const start = minutes(200);
    const ip = '2001:db8:1:2::77';
    for (let i = 0; i < LOGIN_RATE_LIMIT.perAddress; i++) {
      // Rotating within the /64 does not help: it is one address for the limit.
      expect(await attempt(email(`spray${i}`), 'not the password', new Date(start.getTime() + i * 100), `2001:db8:1:2::${i + 1}`)).toEqual({ kind: 'invalid' });
    }
    expect((await attempt(email('engineer'), PASSWORD, new Date(start.getTime() + 6000), ip)).kind).toBe('limited');
    expect((await attempt(email('engineer'), PASSWORD, new Date(start.getTime() + 6000), '2001:db8:1:3::1')).kind).toBe('ok');
  });

  it('does not count unknown addresses together: without a trusted proxy only the account limit applies', async () => {
    const start = minutes(250);
    // More failures than the address limit, each on its own account, none with a known address.
    for (let i = 0; i <= LOGIN_RATE_LIMIT.perAddress; i++) {
      expect(await attempt(email(`nowhere${i}`), 'not the password', new Date(start.getTime() + i * 100), null)).toEqual({ kind: 'invalid' });
    }
    expect((await attempt(email('engineer'), PASSWORD, new Date(start.getTime() + 6000), null)).kind).toBe('ok');
  });

  it('holds the account limit across web processes trying at the same moment', async () => {
    const who = email('concurrent');
    // Two pools: two web processes with their own connections to the one store.
    const pools: Pool[] = [createPool(db.url, 5), createPool(db.url, 5)];
    try {
      const start = minutes(300);
      const results = await Promise.all(
        Array.from({ length: 24 }, (_, i) =>
          signIn(pools[i % 2]!, { email: who, password: 'wrong', ip: `192.0.2.${i + 1}` }, { now: new Date(start.getTime() + 5), scrypt: FAST }),
        ),
      );
      const checked = results.filter((r) => r.kind === 'invalid').length;
      // Never more checked than the limit. Fewer is allowed, none included: each attempt counts
      // the others still pending, so when more than the limit arrive at one moment they may all
      // be refused — the safe side (seen under load).
      expect(checked).toBeLessThanOrEqual(LOGIN_RATE_LIMIT.perAccount);
      expect(results.filter((r) => r.kind === 'limited').length).toBe(24 - checked);
      const { rows } = await db.pool.query(`SELECT count(*)::int AS n FROM login_attempt WHERE email = $1 AND outcome = 'failure'`, [who]);
      expect(rows[0].n).toBe(checked);
    } finally {
      await Promise.all(pools.map((p) => p.end()));
    }
  });

  it('ends a session after 30 idle minutes, and after 12 hours however active', async () => {
    const start = minutes(400);
    const at = (m: number) => new Date(start.getTime() + m * 60_000);
    const idle = await attempt(email('engineer'), PASSWORD, start, '198.51.100.20');
    if (idle.kind !== 'ok') throw new Error('sign-in failed');
    // Each request moves the idle limit: 29 minutes after the last one the session is there, at 30 it is gone.
    expect((await readSession(db.pool, idle.sessionId, at(29))).ok).toBe(true);
    expect(await readSession(db.pool, idle.sessionId, at(58))).toEqual({ ok: true, principal: expect.anything(), csrfToken: idle.csrfToken, expiresAt: idle.expiresAt });
    expect((await readSession(db.pool, idle.sessionId, at(87))).ok).toBe(true);
    expect(await readSession(db.pool, idle.sessionId, at(117))).toEqual({ ok: false, reason: 'idle' });
    // Once ended, it stays ended.
    expect((await readSession(db.pool, idle.sessionId, at(118))).ok).toBe(false);

    const busy = await attempt(email('engineer'), PASSWORD, start, '198.51.100.20');
    if (busy.kind !== 'ok') throw new Error('sign-in failed');
    for (let m = 20; m < 12 * 60; m += 20) expect((await readSession(db.pool, busy.sessionId, at(m))).ok, `minute ${m}`).toBe(true);
    expect(await readSession(db.pool, busy.sessionId, at(12 * 60))).toEqual({ ok: false, reason: 'expired' });
  });

  it('refuses cookies that are malformed or unknown without trusting them', async () => {
    expect(await readSession(db.pool, undefined)).toEqual({ ok: false, reason: 'malformed' });
    expect(await readSession(db.pool, "x' OR 1=1 --")).toEqual({ ok: false, reason: 'malformed' });
    expect(await readSession(db.pool, 'A'.repeat(43))).toEqual({ ok: false, reason: 'unknown' });
  });

  it('signs out of one session, and everywhere', async () => {
    const now = minutes(2000);
    const sign = async () => {
      const r = await attempt(email('engineer'), PASSWORD, now, '198.51.100.30');
      if (r.kind !== 'ok') throw new Error('sign-in failed');
      return r;
    };
    const [a, b, c] = [await sign(), await sign(), await sign()];
    await signOut(db.pool, a.sessionId, { now });
    expect(await readSession(db.pool, a.sessionId, now)).toEqual({ ok: false, reason: 'revoked' });
    expect((await readSession(db.pool, b.sessionId, now)).ok).toBe(true);
    // Another user's session must survive this user's "sign out everywhere".
    const otherEmail = email('bystander');
    await createUser(db.pool, { email: otherEmail, displayName: 'Bystander', role: 'charterer', organisationKey: `org-${s}`, password: PASSWORD }, { actor: { kind: 'cli' }, scrypt: FAST });
    const other = await signIn(db.pool, { email: otherEmail, password: PASSWORD, ip: '198.51.100.31' }, { now, scrypt: FAST });
    if (other.kind !== 'ok') throw new Error('sign-in failed');

    expect(await signOutEverywhere(db.pool, b.principal, { now })).toBeGreaterThanOrEqual(2);
    expect(await readSession(db.pool, b.sessionId, now)).toEqual({ ok: false, reason: 'revoked' });
    expect(await readSession(db.pool, c.sessionId, now)).toEqual({ ok: false, reason: 'revoked' });
    expect((await readSession(db.pool, other.sessionId, now)).ok).toBe(true);
    expect((await readAudit(db.pool, { action: 'auth.sign_out_everywhere' }))[0]).toMatchObject({ actorUserId: engineerId });
    expect(await revokeSession(db.pool, a.sessionId)).toBe(false); // already revoked
  });

  it('ends the other sessions when the password changes, and all of them when the user is disabled', async () => {
    const who = email('rotator');
    const { id } = await createUser(db.pool, { email: who, displayName: 'Rotator', role: 'fleet_manager', password: PASSWORD }, { actor: { kind: 'cli' }, scrypt: FAST });
    const now = new Date();
    const one = await signIn(db.pool, { email: who, password: PASSWORD }, { now, scrypt: FAST });
    const two = await signIn(db.pool, { email: who, password: PASSWORD }, { now, scrypt: FAST });
    if (one.kind !== 'ok' || two.kind !== 'ok') throw new Error('sign-in failed');
    await setUserPassword(db.pool, id, 'a different long passphrase', { actor: one.principal, keepSession: one.sessionId, scrypt: FAST });
    expect((await readSession(db.pool, one.sessionId)).ok).toBe(true);
    expect(await readSession(db.pool, two.sessionId)).toEqual({ ok: false, reason: 'revoked' });
    expect((await signIn(db.pool, { email: who, password: PASSWORD }, { scrypt: FAST })).kind).toBe('invalid');
    await disableUser(db.pool, who, { actor: { kind: 'cli' } });
    expect(await readSession(db.pool, one.sessionId)).toEqual({ ok: false, reason: 'revoked' });
  });

  it("refuses a mutation without this session's CSRF token, or from another origin", async () => {
    const r = await attempt(email('engineer'), PASSWORD, new Date(), '198.51.100.40');
    if (r.kind !== 'ok') throw new Error('sign-in failed');
    const session = await readSession(db.pool, r.sessionId);
    if (!session.ok) throw new Error('session refused');
    const post = { method: 'POST', expectedOrigin: APP, origin: APP, referer: null, secFetchSite: 'same-origin', sessionId: r.sessionId };
    expect(checkCsrf({ ...post, submittedToken: session.csrfToken })).toEqual({ ok: true });
    expect(checkCsrf({ ...post, submittedToken: null })).toEqual({ ok: false, reason: 'token_missing' });
    // A token copied from another user's page belongs to another session.
    const stranger = await attempt(email('bystander'), PASSWORD, new Date(), '198.51.100.41');
    if (stranger.kind !== 'ok') throw new Error('sign-in failed');
    expect(checkCsrf({ ...post, submittedToken: stranger.csrfToken })).toEqual({ ok: false, reason: 'token_mismatch' });
    expect(checkCsrf({ ...post, origin: 'https://evil.example', secFetchSite: 'cross-site', submittedToken: session.csrfToken })).toEqual({ ok: false, reason: 'cross_site' });
    // After sign-in again the token changes with the session.
    const again = await attempt(email('engineer'), PASSWORD, new Date(), '198.51.100.40');
    if (again.kind !== 'ok') throw new Error('sign-in failed');
    expect(again.csrfToken).not.toBe(r.csrfToken);
    expect(csrfTokenFor(again.sessionId)).toBe(again.csrfToken);
  });
});
