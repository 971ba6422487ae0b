import type { Config } from '../../lib/config';
import type { Logger } from '../../lib/log/logger';
import { createIngestCredential, listLiveCredentials, type IssuedCredential } from '../../lib/broker/credentials';
import { ExportInputError } from '../../lib/broker/mosquittoFiles';
import { exportMosquittoFiles } from '../../lib/broker/mosquittoExport';
import { UsageError } from '../usageError';
import { withUserFacingStore } from './userFacingStore';

export const BROKER_USAGE = `usage: holdfast broker export --out DIR
       holdfast broker ingest-credentials`;

function printIngestCredential(issued: IssuedCredential) {
  console.log('New MQTT credentials for the ingest workers (shown only now; Holdfast keeps a PBKDF2-SHA512 hash).');
  console.log('Give every `holdfast ingest` these as MQTT_USERNAME and MQTT_PASSWORD:');
  console.log(`username: ${issued.username}`);
  console.log(`password: ${issued.password}`);
}

/**
 * `holdfast broker export --out DIR`: Mosquitto's password and ACL files for
 * the live MQTT credentials, plus a mosquitto.conf snippet (docs/access-control.md).
 * The first export also makes the ingest workers' credentials and prints
 * them once. `holdfast broker ingest-credentials` replaces those.
 */
export async function brokerCommand(config: Config, log: Logger, args: string[], options: { out?: string }): Promise<void> {
  const [action] = args;
  if (action === 'ingest-credentials' && args.length === 1) {
    return withUserFacingStore(config, log, [], async (store) => {
      printIngestCredential(await createIngestCredential(store.pool, { kind: 'cli' }));
      console.log('The previous ingest credentials no longer work: export the broker files again and reload Mosquitto.');
    });
  }
  if (action === 'export' && args.length === 1) {
    if (!options.out) throw new UsageError(BROKER_USAGE);
    return withUserFacingStore(config, log, [ExportInputError], async (store) => {
      const live = await listLiveCredentials(store.pool);
      if (!live.some((c) => c.kind === 'ingest')) printIngestCredential(await createIngestCredential(store.pool, { kind: 'cli' }));
      const summary = await exportMosquittoFiles(store.pool, options.out!, config.MQTT_TOPIC_ROOT, { kind: 'cli' });
      console.log(`wrote ${summary.passwordFile} (${summary.vessels} vessel(s), ${summary.ingest} ingest user), ${summary.aclFile} and ${summary.configFile}.`);
      console.log('Include holdfast.conf in mosquitto.conf, let the broker user read passwd, and reload Mosquitto (SIGHUP).');
      if (summary.vessels === 0) console.log('No vessel has MQTT credentials yet: make them with `holdfast vessel credentials KEY`.');
    });
  }
  throw new UsageError(BROKER_USAGE);
}
