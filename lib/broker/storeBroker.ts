import type { Pool } from 'pg';
import { startEmbeddedBroker, type EmbeddedBroker } from './embedded';
import { localCredentials, storeBrokerAccess, type LocalCredential } from './embeddedAccess';

/**
 * The embedded broker as `holdfast start` should run it (the safer default,
 * with zero settings): authentication and topic rules always on, vessels
 * signing in with the credentials in the store, and the supervisor's own
 * ingest worker and demo publisher with local credentials made for this
 * start only. The caller hands `local.ingest` to the worker and
 * `local.publisher` to the demo publisher.
 */
export async function startStoreBroker(
  pool: Pool,
  options: { preferredPort: number; topicRoot: string },
): Promise<{ broker: EmbeddedBroker; local: { ingest: LocalCredential; publisher: LocalCredential } }> {
  const local = localCredentials();
  const access = storeBrokerAccess(pool, { topicRoot: options.topicRoot, local: [local.ingest, local.publisher] });
  const broker = await startEmbeddedBroker(options.preferredPort, { access });
  return { broker, local };
}
