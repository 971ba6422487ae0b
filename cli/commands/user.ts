import type { Config } from '../../lib/config';
import type { Logger } from '../../lib/log/logger';
import { OrganisationInputError } from '../../lib/auth/organisations';
import { ROLES } from '../../lib/auth/roles';
import { createUser, disableUser, listUsers, UserInputError } from '../../lib/auth/users';
import { UsageError } from '../usageError';
import { withUserFacingStore } from './userFacingStore';
import { readNewPassword } from './userPasswordInput';

export const USER_USAGE = `usage: holdfast user create --email E --name N --role ${ROLES.join('|')} [--organisation KEY]
       holdfast user list
       holdfast user disable --email E`;

export interface UserOptions {
  email?: string;
  name?: string;
  role?: string;
  organisation?: string;
}

/**
 * `holdfast user create|list|disable` (docs/access-control.md). `create` is
 * how the first admin comes to exist: Holdfast has no default password
 * outside demo mode. The password is typed at the terminal or piped on
 * standard input, and never printed.
 */
export async function userCommand(config: Config, log: Logger, args: string[], options: UserOptions): Promise<void> {
  const [action] = args;
  const inputErrors = [UserInputError, OrganisationInputError];
  if (action === 'create') {
    if (!options.email || !options.name || !options.role) throw new UsageError(USER_USAGE);
    // Read the password before opening the store: typing takes a while.
    const password = await readNewPassword();
    return withUserFacingStore(config, log, inputErrors, async (store) => {
      const user = await createUser(
        store.pool,
        { email: options.email!, displayName: options.name!, role: options.role!, organisationKey: options.organisation, password },
        { actor: { kind: 'cli' } },
      );
      const org = user.organisation;
      console.log(`created user ${user.id} ${user.email} (${user.role}${org ? `, organisation ${org.key}${org.created ? ', new' : ''}` : ''}).`);
      if (org) {
        const { rows } = await store.pool.query<{ n: number }>('SELECT count(*)::int AS n FROM campaign WHERE organisation_id = $1', [org.id]);
        if (rows[0]!.n === 0) console.log(`No campaign belongs to organisation ${org.key} yet, so this charterer sees nothing until one is assigned to it: holdfast campaign assign KEY --organisation ${org.key}`);
      }
    });
  }
  if (action === 'list') {
    return withUserFacingStore(config, log, inputErrors, async (store) => {
      for (const u of await listUsers(store.pool)) {
        const state = u.disabledAt ? `disabled ${u.disabledAt.toISOString()}` : u.canSignIn ? 'active' : 'no password';
        const last = u.lastSignInAt ? `last sign-in ${u.lastSignInAt.toISOString()}` : 'never signed in';
        console.log(`${u.id}\t${u.email}\t${u.role}${u.organisation ? `:${u.organisation}` : ''}\t${state}\t${last}`);
      }
    });
  }
  if (action === 'disable') {
    if (!options.email) throw new UsageError(USER_USAGE);
    return withUserFacingStore(config, log, inputErrors, async (store) => {
      if (!(await disableUser(store.pool, options.email!, { actor: { kind: 'cli' } }))) {
        throw new UsageError(`no enabled user has the e-mail address ${options.email}`);
      }
      console.log(`disabled ${options.email!.trim().toLowerCase()}; every session of it has ended.`);
    });
  }
  throw new UsageError(USER_USAGE);
}
