import { readFileSync } from 'node:fs';
import type { Config } from '../../lib/config';
import { FlagSettingsError } from '../../lib/flags/config';
import { deliverDue } from '../../lib/flags/notify/deliver';
import { addWebhook, listWebhooks, removeWebhook } from '../../lib/flags/notify/webhooks';
import { readFlagSettings, writeFlagSettings } from '../../lib/flags/store/settings';
import type { PrismaClient } from '../../lib/db/prisma';
import { CLOSE_REASONS, type CloseReason, type TransitionResult } from '../../lib/queries/flagLifecycle';
import { describeEvaluation, evaluateDays, lastCompleteDay } from '../../lib/jobs/flagJob';
import type { Logger } from '../../lib/log/logger';
import { daysBetween, isDay } from '../../lib/time/dayRange';
import { openStore, type Store } from '../runtime';
import { UsageError } from '../usageError';

export const FLAGS_USAGE = `usage: holdfast flags evaluate [--day DAY | --from DAY --to DAY]
       holdfast flags ack ID --by NAME [--note TEXT]
       holdfast flags close ID --by NAME --reason ${CLOSE_REASONS.join('|')} [--note TEXT]
       holdfast flags settings [FILE.json]
       holdfast flags webhook add URL [--secret KEY] | webhook list | webhook remove ID
       holdfast flags deliver`;

export interface FlagsOptions {
  day?: string;
  from?: string;
  to?: string;
  by?: string;
  note?: string;
  reason?: string;
  secret?: string;
}

const isId = (s: string | undefined): s is string => s !== undefined && /^\d{1,15}$/.test(s);

/** `holdfast flags …`: trend flags by hand and for scripts (docs/flags.md). */
export async function flagsCommand(config: Config, log: Logger, args: string[], o: FlagsOptions): Promise<void> {
  const [action, arg, extra] = args;
  switch (action) {
    case 'evaluate': {
      let days: string[];
      if (o.day !== undefined && !isDay(o.day)) throw new UsageError(`--day: "${o.day}" is not a day YYYY-MM-DD`);
      try {
        days = o.day ? daysBetween(o.day, o.day) : o.from && o.to ? daysBetween(o.from, o.to) : [lastCompleteDay(config.FLEET_TIME_ZONE)];
      } catch (error) {
        throw new UsageError((error as Error).message);
      }
      return withStore(config, log, async (store) => {
        for (const s of await evaluateDays(store.pool, days, config.FLEET_TIME_ZONE)) console.log(describeEvaluation(s));
      });
    }
    case 'ack':
      if (!isId(arg) || !o.by) break;
      return withPrisma(config, log, async (prisma) => {
        const { acknowledgeFlag } = await import('../../lib/queries/flagLifecycle');
        const result = await acknowledgeFlag(prisma, { id: BigInt(arg), by: o.by!, note: o.note ?? '' });
        refuse(result, arg, 'open');
        console.log(`acknowledged flag ${arg}`);
      });
    case 'close':
      if (!isId(arg) || !o.by || !CLOSE_REASONS.includes(o.reason as CloseReason)) break;
      return withPrisma(config, log, async (prisma) => {
        const { closeFlag } = await import('../../lib/queries/flagLifecycle');
        const result = await closeFlag(prisma, { id: BigInt(arg), by: o.by!, reason: o.reason as CloseReason, note: o.note ?? '' });
        refuse(result, arg, 'open or acknowledged');
        console.log(`closed flag ${arg} (${o.reason})`);
      });
    case 'settings':
      return withStore(config, log, async (store) => {
        if (arg) {
          let value: unknown;
          try {
            value = JSON.parse(readFileSync(arg, 'utf8'));
          } catch (error) {
            throw new UsageError(`${arg}: ${(error as Error).message}`);
          }
          try {
            await writeFlagSettings(store.pool, value);
          } catch (error) {
            if (error instanceof FlagSettingsError) throw new UsageError(`${arg}: ${error.message}`);
            throw error;
          }
        }
        console.log(JSON.stringify(await readFlagSettings(store.pool), null, 2));
      });
    case 'webhook':
      if (arg === 'add' && extra) {
        return withStore(config, log, async (store) => {
          let id: number;
          try {
            id = await addWebhook(store.pool, extra, o.secret ?? null);
          } catch (error) {
            throw new UsageError((error as Error).message);
          }
          console.log(`webhook ${id}: ${extra} receives every flag opened from now on`);
        });
      }
      if (arg === 'list') {
        return withStore(config, log, async (store) => {
          for (const w of await listWebhooks(store.pool)) {
            const error = w.lastError ? `\tlast error: ${w.lastError}` : '';
            console.log(`${w.id}\t${w.url}\t${w.enabled ? 'enabled' : 'disabled'}${w.hasSecret ? ', signed' : ''}\t${w.delivered} delivered, ${w.pending} pending${error}`);
          }
        });
      }
      if (arg === 'remove' && isId(extra)) {
        return withStore(config, log, async (store) => {
          if (!(await removeWebhook(store.pool, Number(extra)))) throw new UsageError(`no webhook has the id ${extra}`);
          console.log(`removed webhook ${extra}`);
        });
      }
      break;
    case 'deliver':
      return withStore(config, log, async (store) => {
        const r = await deliverDue(store.pool);
        console.log(`${r.attempted} attempted, ${r.delivered} delivered, ${r.failed} failed (retried later)`);
      });
  }
  throw new UsageError(FLAGS_USAGE);
}

async function withStore(config: Config, log: Logger, work: (store: Store) => Promise<void>): Promise<void> {
  const store = await openStore(config, log.child('store'));
  try {
    await work(store);
  } finally {
    await store.close();
  }
}

/** The people's side of the lifecycle is the web app's (lib/queries/flagLifecycle.ts); the CLI uses the same functions. */
async function withPrisma(config: Config, log: Logger, work: (prisma: PrismaClient) => Promise<void>): Promise<void> {
  await withStore(config, log, async (store) => {
    // Loaded here: `flags evaluate` (run by scripts) should not carry the Prisma client.
    const { createPrisma } = await import('../../lib/db/prisma');
    const prisma = createPrisma(store.url);
    try {
      await work(prisma);
    } finally {
      await prisma.$disconnect();
    }
  });
}

function refuse(result: TransitionResult, id: string, wanted: string): void {
  if (result === 'not_found') throw new UsageError(`flag ${id}: no flag has this id`);
  if (result === 'wrong_status') throw new UsageError(`flag ${id}: not ${wanted}`);
}
