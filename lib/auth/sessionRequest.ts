import { needsSecureCookie, sessionCookieName } from './sessionCookie';

/**
 * Reading a request for the web layer: the origin the browser used (for the
 * CSRF origin check and the choice of cookie) and the session cookie's
 * value. Pure, so route handlers, server actions and pages read a request
 * the same way.
 */

type HeaderReader = { get(name: string): string | null };

/**
 * The app's own origin as the browser sees it: `X-Forwarded-Proto` /
 * `X-Forwarded-Host` when a TLS proxy in front sets them, else the Host
 * header, else the URL the server was asked for. A cross-site page cannot
 * set these headers on a browser's request, so the origin check stays sound.
 */
export function requestOrigin(headers: HeaderReader, url?: string): string {
  const fallback = url ? new URL(url) : null;
  const proto = firstValue(headers.get('x-forwarded-proto')) ?? fallback?.protocol.replace(':', '') ?? 'http';
  const host = firstValue(headers.get('x-forwarded-host')) ?? headers.get('host') ?? fallback?.host ?? 'localhost';
  return `${proto}://${host}`;
}

/**
 * The client's address for the per-address sign-in limit, or null when it is
 * not known. `X-Forwarded-For` is only believed with `trustProxy` (setting
 * HOLDFAST_TRUST_PROXY): anyone reaching the server directly can write that
 * header, and a forged address per attempt would escape the limit. Behind a
 * trusted proxy the entry it appended, the last, is the one it saw; entries
 * before it came from the client and prove nothing. Next.js does not give
 * route handlers the socket's address, so without a trusted proxy the
 * address is unknown and only the per-account limit applies.
 */
export function clientAddress(headers: HeaderReader, trustProxy: boolean): string | null {
  if (!trustProxy) return null;
  const entries = headers.get('x-forwarded-for')?.split(',').map((e) => e.trim()).filter(Boolean) ?? [];
  return entries.at(-1) ?? headers.get('x-real-ip')?.trim() ?? null;
}

function firstValue(header: string | null): string | null {
  const value = header?.split(',')[0]?.trim();
  return value ? value : null;
}

/** Whether requests to this origin use the Secure `__Host-` cookie (sessionCookie.ts). */
export function secureCookieFor(origin: string): boolean {
  try {
    return needsSecureCookie(origin);
  } catch {
    return true; // an origin that cannot be parsed gets the stricter cookie
  }
}

/** The value of one cookie in a Cookie header (RFC 6265 section 5.4), or null. */
export function cookieValue(cookieHeader: string | null, name: string): string | null {
  if (!cookieHeader) return null;
  for (const part of cookieHeader.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0) continue;
    if (part.slice(0, eq).trim() === name) return part.slice(eq + 1).trim() || null;
  }
  return null;
}

/** The session id a request carries under the cookie name its origin uses. */
export function sessionIdFromCookieHeader(cookieHeader: string | null, url: string, headers?: HeaderReader): string | null {
  const origin = headers ? requestOrigin(headers, url) : new URL(url).origin;
  return cookieValue(cookieHeader, sessionCookieName(secureCookieFor(origin)));
}
