import type { Config } from '../../lib/config';
import type { Logger } from '../../lib/log/logger';
import { openStore, type Store } from '../runtime';
import { UsageError } from '../usageError';

type ErrorClass = abstract new (...args: never[]) => Error;

/**
 * Run `work` on the store (opened and migrated, closed afterwards) for the
 * access-control commands (user, vessel, broker). Errors of the classes in
 * `inputErrors` are the caller's to fix: they become a UsageError (one
 * line, exit code 2) instead of a stack trace.
 */
export async function withUserFacingStore(
  config: Config,
  log: Logger,
  inputErrors: readonly ErrorClass[],
  work: (store: Store) => Promise<void>,
): Promise<void> {
  const store = await openStore(config, log.child('store'));
  try {
    await work(store);
  } catch (error) {
    if (inputErrors.some((kind) => error instanceof kind)) throw new UsageError((error as Error).message);
    throw error;
  } finally {
    await store.close();
  }
}
