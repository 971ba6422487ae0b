import net from 'node:net';
import { Aedes, type AedesOptions, type Client } from 'aedes';
import { preferredOrFreePort } from '../net/freePort';
import type { BrokerAccess, ClientGrant } from './embeddedAccess';
import { mayPublish, maySubscribe } from './topicAccess';

export interface EmbeddedBroker {
  url: string;
  port: number;
  stop(): Promise<void>;
}

export interface EmbeddedBrokerOptions {
  /**
   * Who may connect, publish and subscribe (embeddedAccess.ts). Without it
   * the broker is open: any client, any topic. Open is for the test suite's
   * shared broker only; `holdfast start` passes the store's credentials plus
   * local ones for its own worker and demo publisher (docs/access-control.md).
   */
  access?: BrokerAccess;
}

/**
 * An in-process MQTT 3.1.1 broker (aedes) on 127.0.0.1. Sessions and queued
 * QoS 1 messages live in memory: enough for the demo and tests; a production
 * fleet uses an external broker (MQTT_URL).
 */
export async function startEmbeddedBroker(preferredPort: number, options: EmbeddedBrokerOptions = {}): Promise<EmbeddedBroker> {
  const port = await preferredOrFreePort(preferredPort);
  const guard = options.access ? accessGuard(options.access) : undefined;
  const broker = await Aedes.createBroker(guard?.handlers ?? {});
  guard?.attach(broker);
  const server = net.createServer(broker.handle);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  return {
    url: `mqtt://127.0.0.1:${port}`,
    port,
    stop: () =>
      new Promise<void>((resolve) => {
        guard?.stop();
        // The broker disconnects its clients first, so the server can close.
        broker.close(() => server.close(() => resolve()));
      }),
  };
}

/** CONNACK return codes of MQTT 3.1.1, section 3.2.2.3. */
const IDENTIFIER_REJECTED = 2;
const SERVER_UNAVAILABLE = 3;
const BAD_USERNAME_OR_PASSWORD = 4;
const NOT_AUTHORIZED = 5;

function refusal(message: string, returnCode: number) {
  return Object.assign(new Error(message), { returnCode }) as Error & { returnCode: 2 | 3 | 4 | 5 };
}

/**
 * The aedes hooks that enforce `access`:
 * - authenticate: no username or no password is "not authorised" (5), wrong
 *   ones "bad user name or password" (4), a store that cannot answer "server
 *   unavailable" (3), so a client retries instead of giving up.
 * - a client id stays with the username that first used it while the broker
 *   runs: otherwise a vessel could connect with the ingest worker's client id,
 *   take over its persistent session and receive the fleet's queued messages
 *   (MQTT 3.1.1, 3.1.4: a new connection with a known client id takes the
 *   session over). Refused with "identifier rejected" (2).
 * - authorizePublish: topicAccess.mayPublish; a refused PUBLISH closes the
 *   connection unacknowledged (aedes' behaviour, which MQTT 3.1.1 allows:
 *   3.3.5 "…or it may close the Network Connection"), so nothing is stored.
 * - authorizeSubscribe: topicAccess.maySubscribe; refused filters get the
 *   failure code 0x80 in the SUBACK (3.9.3).
 * - authorizeForward: only to clients that may read under the root, in case
 *   a message reaches a session some other way (retained, restored).
 * - every `recheckEveryMs`, connected clients whose stored credential was
 *   revoked or deleted since they connected are disconnected.
 */
function accessGuard(access: BrokerAccess) {
  const grants = new Map<Client, ClientGrant>();
  const clientOwners = new Map<string, string>();
  let timer: NodeJS.Timeout | undefined;
  const grantOf = (client: Client | null) => (client ? grants.get(client) : undefined);

  const handlers: AedesOptions = {
    authenticate(client, username, password, done) {
      if (!username || !password) return done(refusal('credentials required', NOT_AUTHORIZED), false);
      access.authenticate(username, password.toString('utf8')).then(
        (grant) => {
          if (!grant) return done(refusal('bad user name or password', BAD_USERNAME_OR_PASSWORD), false);
          const owner = clientOwners.get(client.id);
          if (owner !== undefined && owner !== grant.username) return done(refusal('client id taken by another user', IDENTIFIER_REJECTED), false);
          clientOwners.set(client.id, grant.username);
          grants.set(client, grant);
          done(null, true);
        },
        () => done(refusal('cannot check credentials now', SERVER_UNAVAILABLE), false),
      );
    },
    authorizePublish(client, packet, callback) {
      const grant = grantOf(client);
      callback(grant && mayPublish(grant.role, packet.topic, access.topicRoot) ? null : new Error(`not allowed to publish to ${packet.topic}`));
    },
    authorizeSubscribe(client, subscription, callback) {
      const grant = grantOf(client);
      callback(null, grant && maySubscribe(grant.role, subscription.topic, access.topicRoot) ? subscription : null);
    },
    authorizeForward(client, packet) {
      const grant = grantOf(client);
      return grant && maySubscribe(grant.role, packet.topic, access.topicRoot) ? packet : null;
    },
  };

  return {
    handlers,
    attach(broker: Aedes) {
      broker.on('clientDisconnect', (client) => grants.delete(client));
      if (access.recheckEveryMs > 0) {
        timer = setInterval(() => {
          // A client closed before it registered never gets a 'clientDisconnect'.
          for (const client of grants.keys()) if (client.closed) grants.delete(client);
          const stored = [...grants].filter(([, g]) => g.credentialId !== null);
          if (stored.length === 0) return;
          access.stillLive(stored.map(([, g]) => g.credentialId!)).then(
            (live) => {
              for (const [client, grant] of stored) {
                if (!live.has(grant.credentialId!)) {
                  grants.delete(client);
                  client.close();
                }
              }
            },
            () => {}, // the store is away: keep the connections, try again next time
          );
        }, access.recheckEveryMs);
        timer.unref();
      }
    },
    stop() {
      clearInterval(timer);
    },
  };
}
