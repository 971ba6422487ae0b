import type { Principal, TokenPrincipal } from '../auth/principal';
import { isRole } from '../auth/roles';
import { readSession } from '../auth/sessions';
import { sessionIdFromCookieHeader } from '../auth/sessionRequest';
import type { Queryable } from './context';
import { ApiError } from './errors';
import { TOKEN_PATTERN, hashToken } from './tokens';

/**
 * Who is calling the API: the bearer token of `Authorization: Bearer <token>`
 * (RFC 6750 section 2.1), looked up by its SHA-256; without that header, the
 * session cookie of a signed-in user (so the web app's own pages and a
 * signed-in browser can read the API). Either way the caller is a
 * lib/auth Principal and lib/auth/scope.ts decides what it sees.
 *
 * The API is read-only (api-v1), so a cookie-authenticated GET needs no CSRF
 * token: it changes nothing.
 */

// RFC 7235 section 2.1: the auth-scheme is case-insensitive.
const BEARER = /^Bearer +(\S+)\s*$/i;

/**
 * One statement finds a live token and, at most once a minute, stamps
 * last_used_at: the update runs only when the stamp is older than that, so a
 * busy script writes the row once a minute instead of once a request.
 */
const LOOKUP_SQL = `
  WITH found AS (
    SELECT id, role, campaign_id, last_used_at FROM api_token
     WHERE token_hash = $1 AND revoked_at IS NULL
  ), stamped AS (
    UPDATE api_token t SET last_used_at = now()
      FROM found
     WHERE t.id = found.id
       AND (found.last_used_at IS NULL OR found.last_used_at < now() - interval '1 minute')
  )
  SELECT id, role, campaign_id FROM found`;

/** The bearer token of the request, or 401. */
export async function authenticate(db: Queryable, request: Request): Promise<TokenPrincipal> {
  const header = request.headers.get('authorization');
  if (!header) throw new ApiError('unauthorized', 'missing bearer token: send Authorization: Bearer <token>');
  const token = BEARER.exec(header)?.[1];
  if (!token) throw new ApiError('unauthorized', 'the Authorization header must be "Bearer <token>"');
  // A string that cannot be a token is refused without a database round trip.
  if (!TOKEN_PATTERN.test(token)) throw new ApiError('unauthorized', 'unknown or revoked token');
  const { rows } = await db.query<{ id: number; role: string; campaign_id: number | null }>(LOOKUP_SQL, [hashToken(token)]);
  const row = rows[0];
  // A role this version does not know (a row written by a newer one) is refused rather than guessed.
  if (!row || !isRole(row.role)) throw new ApiError('unauthorized', 'unknown or revoked token');
  return { kind: 'token', tokenId: row.id, role: row.role, campaignId: row.campaign_id };
}

/** A bearer token when the request has an Authorization header, else the session cookie, else 401. */
export async function authenticateRequest(db: Queryable, request: Request): Promise<Principal> {
  if (request.headers.has('authorization')) return authenticate(db, request);
  const sessionId = sessionIdFromCookieHeader(request.headers.get('cookie'), request.url, request.headers);
  if (sessionId) {
    const session = await readSession(db, sessionId);
    if (session.ok) return session.principal;
  }
  throw new ApiError('unauthorized', 'missing bearer token: send Authorization: Bearer <token>');
}
