import type { Config } from '../../lib/config';
import type { Logger } from '../../lib/log/logger';
import { createVesselCredential, CredentialInputError, revokeVesselCredential } from '../../lib/broker/credentials';
import { UsageError } from '../usageError';
import { withUserFacingStore } from './userFacingStore';

export const VESSEL_USAGE = 'usage: holdfast vessel credentials KEY [--revoke]';

/**
 * `holdfast vessel credentials KEY`: new MQTT credentials for one vessel's
 * gateway, printed once (the store keeps a hash); the vessel's previous
 * credentials stop working. `--revoke` only takes them away.
 */
export async function vesselCommand(config: Config, log: Logger, args: string[], options: { revoke?: boolean }): Promise<void> {
  const [action, key] = args;
  if (action !== 'credentials' || !key || args.length !== 2) throw new UsageError(VESSEL_USAGE);
  return withUserFacingStore(config, log, [CredentialInputError], async (store) => {
    if (options.revoke) {
      if (!(await revokeVesselCredential(store.pool, key, { kind: 'cli' }))) throw new UsageError(`vessel "${key}" has no live MQTT credentials`);
      console.log(`revoked the MQTT credentials of ${key}. Export the broker files again if it uses Mosquitto.`);
      return;
    }
    const issued = await createVesselCredential(store.pool, key, { kind: 'cli' });
    console.log(`MQTT credentials for vessel ${key}: it may publish to ${config.MQTT_TOPIC_ROOT}/${key}/{stream} only.`);
    console.log('Shown only now; Holdfast keeps a PBKDF2-SHA512 hash. Any earlier credentials of this vessel no longer work.');
    console.log(`username: ${issued.username}`);
    console.log(`password: ${issued.password}`);
  });
}
