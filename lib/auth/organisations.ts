import type { Queryable } from './db';

/**
 * Organisations are the tenants: a charterer user belongs to one and sees the
 * campaigns that name it (campaign.organisation_id). The fleet register
 * (fleet-v1) does not name organisations, so they are made here: when a
 * charterer user is created, and when a campaign is given to one.
 */

/** Organisation keys: lower-case words joined by "-", like vessel keys (common practice, no source). */
export const ORGANISATION_KEY = /^[a-z0-9][a-z0-9-]{1,63}$/;

export class OrganisationInputError extends Error {}

/** The organisation's id, creating it (named `name`, or its key) when missing. */
export async function ensureOrganisation(db: Queryable, key: string, name?: string): Promise<{ id: number; created: boolean }> {
  if (!ORGANISATION_KEY.test(key)) throw new OrganisationInputError(`organisation key "${key.slice(0, 64)}" must be 2 to 64 of a-z, 0-9 and "-", starting with a letter or digit`);
  const inserted = await db.query<{ id: number }>(
    'INSERT INTO organisation (key, name) VALUES ($1, $2) ON CONFLICT (key) DO NOTHING RETURNING id',
    [key, name?.trim() || key],
  );
  if (inserted.rows[0]) return { id: inserted.rows[0].id, created: true };
  const { rows } = await db.query<{ id: number }>('SELECT id FROM organisation WHERE key = $1', [key]);
  return { id: rows[0]!.id, created: false };
}

/**
 * Give a campaign to an organisation (or take it away with null): from then
 * on its charterer users see the campaign's vessels on the campaign's days.
 * False when there is no such campaign.
 */
export async function assignCampaign(db: Queryable, campaignKey: string, organisationId: number | null): Promise<boolean> {
  const { rowCount } = await db.query('UPDATE campaign SET organisation_id = $2 WHERE key = $1', [campaignKey, organisationId]);
  return rowCount === 1;
}
