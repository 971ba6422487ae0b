import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createApiToken, revokeApiToken } from '../lib/api/tokens';
import { SESSION_COOKIE_LOCAL } from '../lib/auth/sessionCookie';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import type { NextServer } from './helpers/nextServer';
import { sharedBuild, startWeb } from './e2e/harness';
import { createTestUser, postSignIn, sessionFrom, signInAs } from './e2e/signIn';

/**
 * Issue 8, must-show 3, through the real HTTP routes of the built web app:
 * login rate limiting, CSRF refusals of the sign-in and sign-out forms,
 * session expiry (idle and absolute), sign-out and sign-out everywhere, and
 * API token revocation. The library-level tests (test/authSignIn.test.ts,
 * test/authTokens.test.ts, lib/auth/*.test.ts) check the rules; these check
 * that the routes apply them.
 */
describe('sign-in, sessions and tokens over HTTP', () => {
  let db: TestDatabase;
  let server: NextServer;

  const get = (path: string, headers: Record<string, string> = {}) => fetch(`${server.url}${path}`, { redirect: 'manual', headers });
  const cookieOf = (sessionId: string) => ({ cookie: `${SESSION_COOKIE_LOCAL}=${sessionId}` });
  /** Whether a session cookie still opens a page and the API. */
  const live = async (sessionId: string) => {
    const [page, api] = await Promise.all([get('/campaigns', cookieOf(sessionId)), get('/api/v1/vessels', cookieOf(sessionId))]);
    if (page.status === 200 && api.status === 200) return true;
    // Ended: the page sends the reader to sign in, the API answers 401.
    expect(page.status).toBe(307);
    expect(new URL(page.headers.get('location')!, server.url).pathname).toBe('/signin');
    expect(api.status).toBe(401);
    return false;
  };
  const csrfOf = async (sessionId: string) => /name="csrf_token" value="([^"]+)"/.exec(await (await get('/campaigns', cookieOf(sessionId))).text())![1]!;
  const postForm = (path: string, fields: Record<string, string>, headers: Record<string, string>) =>
    fetch(`${server.url}${path}`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url, 'sec-fetch-site': 'same-origin', ...headers },
      body: new URLSearchParams(fields).toString(),
    });

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await sharedBuild();
    server = await startWeb(db.url);
  }, 600_000);
  afterAll(async () => {
    await server?.stop();
    await db?.drop();
  });

  it('signs in with an httpOnly SameSite cookie and records it; a wrong password gets the same answer as an unknown address', async () => {
    const { email, password } = await createTestUser(db.pool, 'shore_engineer');
    const ok = await postSignIn(server, email, password);
    expect(ok.status).toBe(303);
    expect(new URL(ok.headers.get('location')!).pathname).toBe('/');
    const cookie = ok.headers.getSetCookie().find((c) => c.startsWith(`${SESSION_COOKIE_LOCAL}=`))!;
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(await live(sessionFrom(ok)!)).toBe(true);

    const wrong = await postSignIn(server, email, 'not the password at all');
    const unknown = await postSignIn(server, 'nobody@tests.holdfast.example', 'not the password at all');
    expect([wrong.status, wrong.headers.get('location')]).toEqual([unknown.status, unknown.headers.get('location')]);
    expect(new URL(wrong.headers.get('location')!).search).toBe('?error=invalid');
    expect(sessionFrom(wrong)).toBeNull();

    const { rows } = await db.pool.query(`SELECT action, detail->>'reason' AS reason FROM audit_log WHERE subject = $1 ORDER BY id`, [email]);
    expect(rows.filter((r) => r.action.startsWith('auth.sign_in'))).toEqual([
      { action: 'auth.sign_in', reason: null },
      { action: 'auth.sign_in_failed', reason: 'wrong_password' },
    ]);
  });

  it('rate-limits failed sign-ins per account: after 10 failures even the right password is refused, without a session', async () => {
    const { email, password } = await createTestUser(db.pool, 'fleet_manager');
    for (let i = 0; i < 10; i++) {
      const refused = await postSignIn(server, email, `wrong password number ${i}`);
      expect(new URL(refused.headers.get('location')!).searchParams.get('error')).toBe('invalid');
    }
    const limited = await postSignIn(server, email, password);
    const location = new URL(limited.headers.get('location')!);
    expect(location.searchParams.get('error')).toBe('limited');
    expect(Number(location.searchParams.get('retry'))).toBeGreaterThan(0);
    expect(sessionFrom(limited)).toBeNull();
    // The page says so, with the wait.
    expect(await (await get(`${location.pathname}${location.search}`)).text()).toContain('Too many failed sign-ins');
  }, 120_000);

  it('refuses a sign-in posted from another site (login CSRF)', async () => {
    const { email, password } = await createTestUser(db.pool, 'admin');
    const foreign = await postSignIn(server, email, password, { origin: 'https://elsewhere.example', 'sec-fetch-site': 'cross-site' });
    expect(foreign.status).toBe(403);
    expect(sessionFrom(foreign)).toBeNull();
    const noOrigin = await fetch(`${server.url}/auth/signin`, {
      method: 'POST',
      redirect: 'manual',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ email, password }).toString(),
    });
    expect(noOrigin.status).toBe(403);
  });

  it('refuses sign-out without the session’s CSRF token or from another site; signs out with it', async () => {
    const user = await signInAs(server, db.pool, 'shore_engineer');
    const csrf = await csrfOf(user.sessionId);
    expect((await postForm('/auth/signout', {}, user.sessionId ? cookieOf(user.sessionId) : {})).status).toBe(403);
    expect((await postForm('/auth/signout', { csrf_token: 'x'.repeat(43) }, cookieOf(user.sessionId))).status).toBe(403);
    expect((await postForm('/auth/signout', { csrf_token: csrf }, { ...cookieOf(user.sessionId), origin: 'https://elsewhere.example' })).status).toBe(403);
    expect(await live(user.sessionId)).toBe(true);

    const out = await postForm('/auth/signout', { csrf_token: csrf }, cookieOf(user.sessionId));
    expect(out.status).toBe(303);
    expect(out.headers.getSetCookie().some((c) => c.startsWith(`${SESSION_COOKIE_LOCAL}=;`) && c.includes('Max-Age=0'))).toBe(true);
    expect(await live(user.sessionId)).toBe(false);
  });

  it('sign-out everywhere ends every session of the user, and only theirs', async () => {
    const first = await signInAs(server, db.pool, 'charterer', 'http-org');
    const second = await postSignIn(server, first.email, first.password);
    const secondId = sessionFrom(second)!;
    const someoneElse = await signInAs(server, db.pool, 'shore_engineer');
    expect(await live(secondId)).toBe(true);

    const out = await postForm('/auth/signout-everywhere', { csrf_token: await csrfOf(first.sessionId) }, cookieOf(first.sessionId));
    expect(out.status).toBe(303);
    expect(await live(first.sessionId)).toBe(false);
    expect(await live(secondId)).toBe(false);
    expect(await live(someoneElse.sessionId)).toBe(true);
  });

  it('ends a session idle for more than 30 minutes, and any session 12 hours after sign-in', async () => {
    const idle = await signInAs(server, db.pool, 'admin');
    const old = await signInAs(server, db.pool, 'admin');
    expect(await live(idle.sessionId)).toBe(true);
    await db.pool.query(`UPDATE user_session SET last_seen_at = now() - interval '31 minutes' WHERE user_id = (SELECT id FROM app_user WHERE email = $1)`, [idle.email]);
    expect(await live(idle.sessionId)).toBe(false);

    expect(await live(old.sessionId)).toBe(true);
    await db.pool.query(
      `UPDATE user_session SET created_at = now() - interval '12 hours 1 minute', expires_at = now() - interval '1 minute' WHERE user_id = (SELECT id FROM app_user WHERE email = $1)`,
      [old.email],
    );
    expect(await live(old.sessionId)).toBe(false);
  });

  it('refuses an API token from the request after its revocation, and stamps when it was last used', async () => {
    const { id, token } = await createApiToken(db.pool, { name: 'http revocation', role: 'fleet_manager' });
    const bearer = { authorization: `Bearer ${token}` };
    expect((await get('/api/v1/vessels', bearer)).status).toBe(200);
    const { rows } = await db.pool.query('SELECT last_used_at FROM api_token WHERE id = $1', [id]);
    expect(Date.now() - rows[0].last_used_at.getTime()).toBeLessThan(60_000);
    await revokeApiToken(db.pool, id);
    const refused = await get('/api/v1/vessels', bearer);
    expect(refused.status).toBe(401);
    expect(refused.headers.get('www-authenticate')).toBe('Bearer realm="holdfast"');
    expect(await refused.json()).toMatchObject({ error: { code: 'unauthorized' } });
  });
});
