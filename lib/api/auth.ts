import type { Queryable } from './context';
import { ApiError } from './errors';
import { TOKEN_PATTERN, hashToken, type Role } from './tokens';

/**
 * Who is calling: the bearer token of `Authorization: Bearer <token>`
 * (RFC 6750 section 2.1), looked up by its SHA-256.
 *
 * Roles are recorded but not enforced yet: until the access-control issue
 * every valid token reads as an admin (docs/api.md says so). `role` and
 * `campaignId` are carried so that the tenancy filter can be added here
 * without changing the routes.
 */
export interface Principal {
  tokenId: number;
  role: Role;
  campaignId: number | null;
}

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

export async function authenticate(db: Queryable, request: Request): Promise<Principal> {
  const header = request.headers.get('authorization');
  if (!header) throw new ApiError('unauthorized', 'missing bearer token: send Authorization: Bearer <token>');
  const token = BEARER.exec(header)?.[1];
  if (!token) throw new ApiError('unauthorized', 'the Authorization header must be "Bearer <token>"');
  // A string that cannot be a token is refused without a database round trip.
  if (!TOKEN_PATTERN.test(token)) throw new ApiError('unauthorized', 'unknown or revoked token');
  const { rows } = await db.query<{ id: number; role: Role; campaign_id: number | null }>(LOOKUP_SQL, [hashToken(token)]);
  const row = rows[0];
  if (!row) throw new ApiError('unauthorized', 'unknown or revoked token');
  return { tokenId: row.id, role: row.role, campaignId: row.campaign_id };
}
