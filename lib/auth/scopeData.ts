import type { Queryable } from './db';
import type { Principal } from './principal';
import { campaignsOf, scopeFor, type CampaignFacts, type Scope } from './scope';

/**
 * The database half of the tenancy rule: reads the campaign facts scope.ts
 * needs and returns the principal's scope. Read per request (campaigns are
 * few, and a register import or a new assignment then applies at once).
 */

const CAMPAIGNS_SQL = `
  SELECT c.id, c.key, c.organisation_id AS "organisationId",
         c.from_day::text AS "fromDay", c.to_day::text AS "toDay",
         coalesce(array_agg(v.key ORDER BY v.key) FILTER (WHERE v.key IS NOT NULL), '{}') AS "vesselKeys"
    FROM campaign c
    LEFT JOIN campaign_vessel cv ON cv.campaign_id = c.id
    LEFT JOIN vessel v ON v.id = cv.vessel_id
   WHERE ($1::int IS NULL OR c.organisation_id = $1) AND ($2::int IS NULL OR c.id = $2)
   GROUP BY c.id
   ORDER BY c.key`;

/** Campaign facts: all of them, or only those of one organisation or one campaign. */
export async function loadCampaignFacts(db: Queryable, filter: { organisationId?: number; campaignId?: number } = {}): Promise<CampaignFacts[]> {
  const { rows } = await db.query<CampaignFacts>(CAMPAIGNS_SQL, [filter.organisationId ?? null, filter.campaignId ?? null]);
  return rows;
}

export async function scopeOf(db: Queryable, principal: Principal): Promise<Scope> {
  if (principal.role !== 'charterer') return scopeFor(principal, []);
  // Read only what a charterer can be tied to; an untied charterer reads nothing and sees nothing.
  const id = principal.kind === 'token' ? principal.campaignId : principal.organisationId;
  if (id === null) return scopeFor(principal, []);
  const facts = await loadCampaignFacts(db, principal.kind === 'token' ? { campaignId: id } : { organisationId: id });
  // scopeFor filters again: the SQL narrows the reading, the pure rule decides.
  return scopeFor(principal, campaignsOf(principal, facts));
}
