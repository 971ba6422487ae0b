import { randomBytes } from 'node:crypto';
import type { Pool } from 'pg';
import { SESSION_COOKIE_LOCAL } from '../lib/auth/sessionCookie';
import { createSession } from '../lib/auth/sessions';
import { createUser } from '../lib/auth/users';

/**
 * A Cookie header signing a benchmark's page requests in as a fleet manager
 * (who sees the whole fleet) on a plain-http local server: every page needs
 * a session, and without one a request is redirected to /signin and would
 * time the sign-in page instead. The user is a throw-away one with a cheap
 * scrypt setting and a random password nobody learns.
 */
export async function benchSessionCookie(pool: Pool, name: string): Promise<string> {
  const user = await createUser(
    pool,
    { email: `${name}@bench.holdfast.example`, displayName: name, role: 'fleet_manager', password: randomBytes(18).toString('base64url') },
    { actor: { kind: 'system' }, scrypt: { ln: 10, r: 8, p: 1 } },
  );
  const session = await createSession(pool, user.id);
  return `${SESSION_COOKIE_LOCAL}=${session.sessionId}`;
}
