import { writeAudit } from '../../lib/auth/audit';
import type { Config } from '../../lib/config';
import { createApiToken, listApiTokens, revokeApiToken, ROLES, TokenInputError } from '../../lib/api/tokens';
import type { Logger } from '../../lib/log/logger';
import { openStore } from '../runtime';
import { UsageError } from '../usageError';

export const TOKEN_USAGE = `usage: holdfast token create --name NAME --role ${ROLES.join('|')} [--campaign KEY]
       holdfast token list
       holdfast token revoke ID`;

export interface TokenOptions {
  name?: string;
  role?: string;
  campaign?: string;
}

/**
 * `holdfast token create|list|revoke`: API bearer tokens (docs/api.md).
 * `create` prints the token alone on its last line, so a script can take it
 * with `tail -n 1`; it is shown this once and stored only as a hash.
 */
export async function tokenCommand(config: Config, log: Logger, args: string[], options: TokenOptions): Promise<void> {
  const [action, id] = args;
  if (action === 'create') {
    if (!options.name || !options.role) throw new UsageError(TOKEN_USAGE);
    return withStore(config, log, async (store) => {
      const created = await createApiToken(store.pool, { name: options.name!, role: options.role!, campaignKey: options.campaign });
      await writeAudit(store.pool, {
        actor: { kind: 'cli' },
        action: 'token.create',
        subject: `token ${created.id}`,
        detail: { name: options.name!.trim(), role: options.role, campaign: options.campaign ?? null },
      });
      console.log(
        `created token ${created.id} "${options.name!.trim()}" (${options.role}${options.campaign ? `, campaign ${options.campaign}` : ''}).`,
      );
      console.log('It is shown only now; Holdfast keeps its SHA-256. It reads what a user of its role sees (docs/access-control.md).');
      console.log(created.token);
    });
  }
  if (action === 'list') {
    return withStore(config, log, async (store) => {
      for (const t of await listApiTokens(store.pool)) {
        const state = t.revokedAt ? `revoked ${t.revokedAt.toISOString()}` : 'active';
        const used = t.lastUsedAt ? `last used ${t.lastUsedAt.toISOString()}` : 'never used';
        console.log(`${t.id}\t${t.name}\t${t.role}${t.campaign ? `:${t.campaign}` : ''}\t${state}\t${used}`);
      }
    });
  }
  if (action === 'revoke' && id && /^\d{1,9}$/.test(id)) {
    return withStore(config, log, async (store) => {
      if (!(await revokeApiToken(store.pool, Number(id)))) throw new UsageError(`no token has the id ${id}`);
      await writeAudit(store.pool, { actor: { kind: 'cli' }, action: 'token.revoke', subject: `token ${id}` });
      console.log(`revoked token ${id}`);
    });
  }
  throw new UsageError(TOKEN_USAGE);
}

async function withStore(config: Config, log: Logger, work: (store: Awaited<ReturnType<typeof openStore>>) => Promise<void>) {
  const store = await openStore(config, log.child('store'));
  try {
    await work(store);
  } catch (error) {
    // A bad role or an unknown campaign is the caller's to fix: one line, exit code 2.
    if (error instanceof TokenInputError) throw new UsageError(error.message);
    throw error;
  } finally {
    await store.close();
  }
}
