import { randomBytes } from 'node:crypto';
import type { Pool } from 'pg';
import { assignCampaign, ensureOrganisation } from './organisations';
import type { ScryptParams } from './password';
import type { Role } from './roles';
import { createUser } from './users';

/**
 * Demo mode only (`npm start` on an empty store, issue 8): one user per role
 * with a random password, to be printed once by the caller. Made only when
 * there are no users at all, so a real installation never gets them, and
 * never with a fixed password: each start on an empty store draws new ones.
 * The demo charterer belongs to an organisation that is given one demo
 * campaign, so signing in as it shows what a charterer sees.
 */

export interface DemoUser {
  role: Role;
  email: string;
  password: string;
}

const DEMO_DOMAIN = 'demo.holdfast.example'; // .example is reserved for examples (RFC 2606)

export async function createDemoUsers(
  pool: Pool,
  charterer: { organisationKey: string; organisationName: string; campaignKey: string },
  options: { scrypt?: ScryptParams } = {},
): Promise<DemoUser[] | null> {
  const { rows } = await pool.query<{ any: boolean }>('SELECT EXISTS (SELECT 1 FROM app_user) AS any');
  if (rows[0]!.any) return null;
  const organisation = await ensureOrganisation(pool, charterer.organisationKey, charterer.organisationName);
  await assignCampaign(pool, charterer.campaignKey, organisation.id);
  const roles: Role[] = ['admin', 'fleet_manager', 'shore_engineer', 'charterer'];
  const users: DemoUser[] = [];
  for (const role of roles) {
    // 18 random bytes: 24 base64url characters, 144 bits.
    const user = { role, email: `${role.replace('_', '-')}@${DEMO_DOMAIN}`, password: randomBytes(18).toString('base64url') };
    await createUser(
      pool,
      {
        email: user.email,
        displayName: `Demo ${role.replace('_', ' ')}`,
        role,
        organisationKey: role === 'charterer' ? charterer.organisationKey : undefined,
        password: user.password,
      },
      { actor: { kind: 'system' }, scrypt: options.scrypt },
    );
    users.push(user);
  }
  return users;
}
