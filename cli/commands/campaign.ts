import type { Config } from '../../lib/config';
import type { Logger } from '../../lib/log/logger';
import { writeAudit } from '../../lib/auth/audit';
import { inTransaction } from '../../lib/auth/db';
import { assignCampaign, ensureOrganisation, OrganisationInputError } from '../../lib/auth/organisations';
import { UsageError } from '../usageError';
import { withUserFacingStore } from './userFacingStore';

export const CAMPAIGN_USAGE = 'usage: holdfast campaign assign KEY --organisation ORG | holdfast campaign unassign KEY';

/**
 * `holdfast campaign assign KEY --organisation ORG`: give a campaign of the
 * fleet register to a charterer's organisation (made when new), so that its
 * charterer users and tokens see the campaign's vessels on the campaign's
 * days; `unassign` takes it away. The register (fleet-v1) names no
 * organisations, and an import never changes this. Audited.
 */
export async function campaignCommand(config: Config, log: Logger, args: string[], options: { organisation?: string }): Promise<void> {
  const [action, key] = args;
  if (!key || args.length !== 2 || !(action === 'assign' ? options.organisation : action === 'unassign')) throw new UsageError(CAMPAIGN_USAGE);
  return withUserFacingStore(config, log, [OrganisationInputError], (store) =>
    inTransaction(store.pool, async (db) => {
      const organisation = action === 'assign' ? await ensureOrganisation(db, options.organisation!) : null;
      if (!(await assignCampaign(db, key, organisation?.id ?? null))) throw new UsageError(`no campaign "${key}" in the fleet register`);
      await writeAudit(db, {
        actor: { kind: 'cli' },
        action: action === 'assign' ? 'campaign.assign' : 'campaign.unassign',
        subject: key,
        detail: organisation ? { organisation: options.organisation, organisationCreated: organisation.created } : {},
      });
      console.log(
        organisation
          ? `campaign ${key} now belongs to organisation ${options.organisation}${organisation.created ? ' (new)' : ''}: its charterers see the campaign's vessels on its days.`
          : `campaign ${key} belongs to no organisation now: no charterer sees it.`,
      );
    }),
  );
}
