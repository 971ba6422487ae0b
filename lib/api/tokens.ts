import { createHash, randomBytes } from 'node:crypto';
import type { Queryable } from './context';

/**
 * API bearer tokens: made, hashed, stored, listed and revoked. The token
 * itself is shown once, at creation; the store keeps only its SHA-256
 * (why a fast, unsalted hash is enough: prisma/migrations/0008_api_tokens.sql).
 */

export const ROLES = ['admin', 'fleet_manager', 'shore_engineer', 'charterer'] as const;
export type Role = (typeof ROLES)[number];

/**
 * `hf_` + 32 random bytes in base64url (43 characters). The prefix lets a
 * reader, a log filter or a secret scanner recognise a Holdfast token.
 */
export const TOKEN_PATTERN = /^hf_[A-Za-z0-9_-]{43}$/;

export function generateToken(): string {
  return `hf_${randomBytes(32).toString('base64url')}`;
}

export function hashToken(token: string): string {
  return createHash('sha256').update(token, 'utf8').digest('hex');
}

/** A token request that cannot be met (bad role, unknown campaign): one line for the user. */
export class TokenInputError extends Error {}

export interface NewToken {
  id: number;
  token: string;
}

export async function createApiToken(
  db: Queryable,
  input: { name: string; role: string; campaignKey?: string },
): Promise<NewToken> {
  const name = input.name.trim();
  if (name.length < 1 || name.length > 100) throw new TokenInputError('--name must be 1 to 100 characters');
  if (!(ROLES as readonly string[]).includes(input.role)) {
    throw new TokenInputError(`--role must be one of ${ROLES.join(', ')} (got "${input.role}")`);
  }
  // Mirrors the table's CHECK, with a message that says what to do.
  if (input.role === 'charterer' && !input.campaignKey) throw new TokenInputError('a charterer token needs --campaign KEY');
  if (input.role !== 'charterer' && input.campaignKey) throw new TokenInputError('--campaign is only for a charterer token');
  let campaignId: number | null = null;
  if (input.campaignKey) {
    const { rows } = await db.query<{ id: number }>('SELECT id FROM campaign WHERE key = $1', [input.campaignKey]);
    if (!rows[0]) throw new TokenInputError(`unknown campaign "${input.campaignKey}"`);
    campaignId = rows[0].id;
  }
  const token = generateToken();
  const { rows } = await db.query<{ id: number }>(
    'INSERT INTO api_token (name, role, campaign_id, token_hash) VALUES ($1, $2, $3, $4) RETURNING id',
    [name, input.role, campaignId, hashToken(token)],
  );
  return { id: rows[0]!.id, token };
}

export interface TokenListing {
  id: number;
  name: string;
  role: Role;
  campaign: string | null;
  createdAt: Date;
  lastUsedAt: Date | null;
  revokedAt: Date | null;
}

export async function listApiTokens(db: Queryable): Promise<TokenListing[]> {
  const { rows } = await db.query<TokenListing>(
    `SELECT t.id, t.name, t.role, c.key AS campaign, t.created_at AS "createdAt",
            t.last_used_at AS "lastUsedAt", t.revoked_at AS "revokedAt"
       FROM api_token t LEFT JOIN campaign c ON c.id = t.campaign_id
      ORDER BY t.id`,
  );
  return rows;
}

/** Revoke by id; false when there is no such token. Revoking twice keeps the first time. */
export async function revokeApiToken(db: Queryable, id: number): Promise<boolean> {
  const { rowCount } = await db.query(
    'UPDATE api_token SET revoked_at = coalesce(revoked_at, now()) WHERE id = $1',
    [id],
  );
  return rowCount === 1;
}
