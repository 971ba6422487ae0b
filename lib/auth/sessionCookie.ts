import { SESSION_LIFETIME_MS } from './sessionPolicy';

/**
 * The session cookie's name and attributes (RFC 6265; OWASP Session
 * Management Cheat Sheet, "Cookies"):
 * - HttpOnly: page scripts cannot read it, so an injected script cannot
 *   carry the session away.
 * - SameSite=Lax: not sent on cross-site subrequests or POSTs, still sent
 *   when a user follows a link to Holdfast from mail or chat (Strict would
 *   show them signed out).
 * - Secure, and the `__Host-` prefix, everywhere except plain http on the
 *   machine itself (development and the local demo): the browser then sends
 *   it only over TLS, to this host only, for every path (RFC 6265bis,
 *   "Cookie Name Prefixes"). Served over plain http from another host, the
 *   browser drops a Secure cookie and sign-in fails visibly, instead of
 *   sending the session in clear text.
 * - Max-Age: the absolute lifetime; the idle limit is checked on the server.
 */
export const SESSION_COOKIE_SECURE = '__Host-holdfast_session';
export const SESSION_COOKIE_LOCAL = 'holdfast_session';

const LOOPBACK = new Set(['localhost', '127.0.0.1', '[::1]', '::1']);

/** Whether the app, reached at `appUrl`, must use the Secure cookie. */
export function needsSecureCookie(appUrl: string): boolean {
  const url = new URL(appUrl);
  return !(url.protocol === 'http:' && (LOOPBACK.has(url.hostname) || url.hostname.endsWith('.localhost')));
}

export function sessionCookieName(secure: boolean): string {
  return secure ? SESSION_COOKIE_SECURE : SESSION_COOKIE_LOCAL;
}

export interface CookieSpec {
  name: string;
  value: string;
  httpOnly: true;
  sameSite: 'lax';
  secure: boolean;
  path: '/';
  maxAge: number;
}

/** The cookie that carries `sessionId`, in the shape Next.js `cookies().set` takes. */
export function sessionCookie(sessionId: string, secure: boolean, lifetimeMs = SESSION_LIFETIME_MS): CookieSpec {
  return { name: sessionCookieName(secure), value: sessionId, httpOnly: true, sameSite: 'lax', secure, path: '/', maxAge: Math.floor(lifetimeMs / 1000) };
}

/** The same cookie, emptied and expired: what sign-out sends. */
export function clearedSessionCookie(secure: boolean): CookieSpec {
  return { ...sessionCookie('', secure), maxAge: 0 };
}

/** The cookie as a Set-Cookie header value, for route handlers that build the response themselves. */
export function setCookieHeader(cookie: CookieSpec): string {
  return [
    `${cookie.name}=${cookie.value}`,
    'Path=/',
    `Max-Age=${cookie.maxAge}`,
    'HttpOnly',
    'SameSite=Lax',
    ...(cookie.secure ? ['Secure'] : []),
  ].join('; ');
}
