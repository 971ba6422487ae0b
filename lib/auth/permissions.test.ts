import { describe, expect, it } from 'vitest';
import { ACTIONS, allowedActions, can, type Action } from './permissions';
import type { Principal } from './principal';
import { ROLES, type Role } from './roles';

/** The whole matrix of issue 8, written out so that a change to it is a visible change here. */
const EXPECTED: Record<Role, Action[]> = {
  charterer: [],
  shore_engineer: ['flag.acknowledge', 'flag.close'],
  fleet_manager: ['flag.acknowledge', 'flag.close', 'register.import'],
  admin: [...ACTIONS],
};

const user = (role: Role, organisationId: number | null = null): Principal => ({ kind: 'user', userId: 7, email: 'u@example.com', role, organisationId });

describe('can: what each role may change', () => {
  it.each(ROLES.map((r) => [r] as const))('%s, signed in', (role) => {
    for (const action of ACTIONS) expect(can(user(role, role === 'charterer' ? 1 : null), action), `${role} ${action}`).toBe(EXPECTED[role].includes(action));
    expect(allowedActions(user(role, 1))).toEqual(EXPECTED[role]);
  });

  it('an API token changes nothing, whatever its role', () => {
    for (const role of ROLES) {
      for (const action of ACTIONS) expect(can({ kind: 'token', tokenId: 1, role, campaignId: null }, action)).toBe(false);
    }
  });

  it('a role the code does not know changes nothing', () => {
    for (const action of ACTIONS) expect(can(user('root' as Role), action)).toBe(false);
  });

  it('every role may do at least what the role below it may', () => {
    for (let i = 1; i < ROLES.length; i++) {
      const below = new Set(EXPECTED[ROLES[i - 1]!]);
      for (const action of below) expect(EXPECTED[ROLES[i]!]).toContain(action);
    }
  });
});
