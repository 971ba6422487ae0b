import { createHmac, timingSafeEqual } from 'node:crypto';

/**
 * Cross-site request forgery protection for every state-changing request
 * (OWASP Cross-Site Request Forgery Prevention Cheat Sheet). Two independent
 * checks, both required:
 *
 * 1. Where the request comes from ("Verifying Origin With Standard Headers"
 *    and "Fetch Metadata headers"): `Sec-Fetch-Site`, when the browser sends
 *    it, must be `same-origin`; `Origin` (or, without it, the origin of
 *    `Referer`) must be the app's own origin. A request that carries neither
 *    is refused: every browser that runs the app sends one of them on a POST.
 * 2. A per-session token (the "Synchronizer Token Pattern"): the page embeds
 *    it in each form or sends it as the `x-csrf-token` header, and it must
 *    match the session of the cookie. The token is derived from the session
 *    id, HMAC-SHA256(key = session id, "holdfast csrf v1"), so no extra state
 *    is stored, it changes with every sign-in, and it dies with the session.
 *    It reveals nothing about the session id (HMAC is one-way), and a page
 *    of another site can neither read the httpOnly cookie nor the token.
 *
 * The session cookie is also SameSite=Lax (sessionCookie.ts), which on its
 * own stops most cross-site POSTs in current browsers; the checks above do
 * not rely on it.
 *
 * Sign-in itself has no session yet: it gets check 1 only (`requireToken:
 * false`), which stops a foreign page from signing a visitor in to an
 * account of the attacker's ("login CSRF").
 */

export const CSRF_HEADER = 'x-csrf-token';
export const CSRF_FIELD = 'csrf_token';

export function csrfTokenFor(sessionId: string): string {
  return createHmac('sha256', sessionId).update('holdfast csrf v1').digest('base64url');
}

/** Methods that never change state (RFC 9110 section 9.2.1) need no check. */
const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

export interface CsrfRequest {
  method: string;
  /** The app's own origin, e.g. `https://holdfast.example.com` (scheme, host and port). */
  expectedOrigin: string;
  origin: string | null;
  referer: string | null;
  secFetchSite: string | null;
  /** The session id from the cookie, when there is one. */
  sessionId: string | null;
  /** The token from the form field or header. */
  submittedToken: string | null;
}

export type CsrfRefusal = 'cross_site' | 'origin_mismatch' | 'no_origin' | 'no_session' | 'token_missing' | 'token_mismatch';
export type CsrfResult = { ok: true } | { ok: false; reason: CsrfRefusal };

export function checkCsrf(request: CsrfRequest, options: { requireToken?: boolean } = {}): CsrfResult {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return { ok: true };
  const site = request.secFetchSite?.trim().toLowerCase();
  if (site && site !== 'same-origin') return { ok: false, reason: 'cross_site' };
  const origin = request.origin?.trim() || originOf(request.referer);
  if (!origin) return { ok: false, reason: 'no_origin' };
  // "null" (an opaque origin: sandboxed frame, data: URL) never equals a real origin.
  if (origin !== normaliseOrigin(request.expectedOrigin)) return { ok: false, reason: 'origin_mismatch' };
  if (options.requireToken === false) return { ok: true };
  if (!request.sessionId) return { ok: false, reason: 'no_session' };
  if (!request.submittedToken) return { ok: false, reason: 'token_missing' };
  const expected = Buffer.from(csrfTokenFor(request.sessionId));
  const given = Buffer.from(request.submittedToken);
  // Constant-time comparison; lengths are compared first because timingSafeEqual needs equal lengths.
  if (given.length !== expected.length || !timingSafeEqual(given, expected)) return { ok: false, reason: 'token_mismatch' };
  return { ok: true };
}

function originOf(url: string | null): string | null {
  if (!url) return null;
  try {
    const origin = new URL(url).origin;
    return origin === 'null' ? null : origin;
  } catch {
    return null;
  }
}

/** `https://Example.com:443/` and `https://example.com` are the same origin (RFC 6454 section 4). */
function normaliseOrigin(origin: string): string {
  try {
    return new URL(origin).origin;
  } catch {
    return origin;
  }
}
