import { cookies, headers } from 'next/headers';
import { cache } from 'react';
import type { Queryable } from '../auth/db';
import { readSession, type SessionCheck } from '../auth/sessions';
import { sessionCookieName } from '../auth/sessionCookie';
import { clientAddress, requestOrigin, secureCookieFor } from '../auth/sessionRequest';
import { loadConfig } from '../config';

/**
 * The session of the request being rendered (a page, a server action, a
 * route handler), read through Next.js' cookies() and headers().
 */
export interface RequestSession {
  check: SessionCheck;
  /** The cookie's value, for sign-out and the CSRF check. */
  sessionId: string | null;
  /** The app's origin as the browser sees it (CSRF origin check). */
  origin: string;
  /** Whether the session cookie is the Secure `__Host-` one. */
  secure: boolean;
  ip: string | null;
  userAgent: string | null;
  headers: Headers;
}

/** Read once per request however many components ask (React's cache() lasts one server render). */
export const requestSession = cache(async (db: Queryable): Promise<RequestSession> => {
  const h = await headers();
  const origin = requestOrigin(h);
  const secure = secureCookieFor(origin);
  const sessionId = (await cookies()).get(sessionCookieName(secure))?.value ?? null;
  return {
    check: await readSession(db, sessionId),
    sessionId,
    origin,
    secure,
    ip: clientAddress(h, loadConfig().HOLDFAST_TRUST_PROXY),
    userAgent: h.get('user-agent'),
    headers: new Headers(h),
  };
});
