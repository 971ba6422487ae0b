import type { Principal } from './principal';
import type { Role } from './roles';

/**
 * What a principal may change. Reading is decided by scope.ts; this file
 * decides every mutation, so a page, a server action and the CLI refuse the
 * same things.
 *
 * The roles are cumulative (issue 8): shore engineers work through flags;
 * fleet managers also manage the register; admins also manage people and
 * credentials. Charterers only read. An API token never changes anything:
 * the JSON API (api-v1) is read-only, so a leaked token can leak data but
 * cannot alter the record.
 */
export const ACTIONS = [
  'flag.acknowledge',
  'flag.close',
  'register.import',
  // Webhooks send flags to an outside address: as sensitive as a credential.
  'webhook.manage',
  'user.manage',
  'token.manage',
  'mqtt_credential.manage',
  'audit.read',
] as const;
export type Action = (typeof ACTIONS)[number];

/** The least trusted role that may take each action. */
const MINIMUM_ROLE: Record<Action, Exclude<Role, 'charterer'>> = {
  'flag.acknowledge': 'shore_engineer',
  'flag.close': 'shore_engineer',
  'register.import': 'fleet_manager',
  'webhook.manage': 'admin',
  'user.manage': 'admin',
  'token.manage': 'admin',
  'mqtt_credential.manage': 'admin',
  'audit.read': 'admin',
};

const RANK: Record<Role, number> = { charterer: 0, shore_engineer: 1, fleet_manager: 2, admin: 3 };

export function can(principal: Principal, action: Action): boolean {
  if (principal.kind !== 'user') return false;
  const rank = RANK[principal.role];
  // An unknown role (a row written by a newer version) may do nothing.
  return rank !== undefined && rank >= RANK[MINIMUM_ROLE[action]];
}

/** Every action the principal may take, e.g. to decide which buttons a page shows. */
export function allowedActions(principal: Principal): Action[] {
  return ACTIONS.filter((action) => can(principal, action));
}
