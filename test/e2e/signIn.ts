import { randomBytes } from 'node:crypto';
import type { Pool } from 'pg';
import { ensureOrganisation } from '../../lib/auth/organisations';
import { SESSION_COOKIE_LOCAL } from '../../lib/auth/sessionCookie';
import type { Role } from '../../lib/auth/roles';
import { createUser } from '../../lib/auth/users';
import type { NextServer } from '../helpers/nextServer';

/**
 * Signing in for the browser and probe tests, through the real sign-in
 * route: a user of a role is created in the test's database, its password
 * is posted to /auth/signin as the sign-in form does, and the session
 * cookie the server sets is what the test sends from then on.
 */

// A cheap scrypt for the users the tests make (the cost is a parameter of the stored hash; sign-in re-hashes to the default once).
const TEST_SCRYPT = { ln: 10, r: 8, p: 1 };

export interface SignedIn {
  email: string;
  password: string;
  role: Role;
  /** The session cookie's value. */
  sessionId: string;
  /** `name=value`, for a Cookie header. */
  cookie: string;
}

let counter = 0;

/** A new user of `role` (a charterer of `organisationKey`), with a random password. */
export async function createTestUser(pool: Pool, role: Role, organisationKey?: string): Promise<{ email: string; password: string }> {
  if (organisationKey) await ensureOrganisation(pool, organisationKey);
  const email = `${role.replace('_', '-')}-${process.pid}-${++counter}@tests.holdfast.example`;
  const password = randomBytes(18).toString('base64url');
  await createUser(pool, { email, displayName: `Test ${role}`, role, organisationKey, password }, { actor: { kind: 'system' }, scrypt: TEST_SCRYPT });
  return { email, password };
}

/** POST the sign-in form as a browser on the app's own page would; the raw answer. */
export function postSignIn(server: NextServer, email: string, password: string, headers: Record<string, string> = {}): Promise<Response> {
  return fetch(`${server.url}/auth/signin`, {
    method: 'POST',
    redirect: 'manual',
    headers: { 'content-type': 'application/x-www-form-urlencoded', origin: server.url, 'sec-fetch-site': 'same-origin', ...headers },
    body: new URLSearchParams({ email, password }).toString(),
  });
}

/** The session id the answer's Set-Cookie carries, or null. */
export function sessionFrom(response: Response): string | null {
  for (const line of response.headers.getSetCookie()) {
    const [pair] = line.split(';');
    const [name, value] = pair!.split('=');
    if (name === SESSION_COOKIE_LOCAL && value) return value;
  }
  return null;
}

export async function signInAs(server: NextServer, pool: Pool, role: Role, organisationKey?: string): Promise<SignedIn> {
  const { email, password } = await createTestUser(pool, role, organisationKey);
  const response = await postSignIn(server, email, password);
  const sessionId = sessionFrom(response);
  if (response.status !== 303 || !sessionId) throw new Error(`sign-in as ${role} failed: ${response.status} ${response.headers.get('location')}`);
  return { email, password, role, sessionId, cookie: `${SESSION_COOKIE_LOCAL}=${sessionId}` };
}

/** Signs a browser in to `server` as a new user of `role`: the session cookie goes into the browser's cookie jar. */
export async function signInBrowser(
  context: { addCookies(cookies: { name: string; value: string; url: string; httpOnly?: boolean; sameSite?: 'Lax' }[]): Promise<void> },
  server: NextServer,
  pool: Pool,
  role: Role = 'admin',
): Promise<SignedIn> {
  const user = await signInAs(server, pool, role);
  await context.addCookies([{ name: SESSION_COOKIE_LOCAL, value: user.sessionId, url: server.url, httpOnly: true, sameSite: 'Lax' }]);
  return user;
}
