import mqtt from 'mqtt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { IngestWorker } from '../ingest/worker';
import type { EmbeddedBroker } from '../lib/broker/embedded';
import type { LocalCredential } from '../lib/broker/embeddedAccess';
import { startStoreBroker } from '../lib/broker/storeBroker';
import { signedInWorker, stationRecord, storedMinutes } from './brokerHelpers';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * The embedded broker as `holdfast start` is meant to run it: closed to
 * anyone without credentials, open to its own worker and demo publisher
 * through the local credentials of this start, with no setting at all.
 */
describe('startStoreBroker', () => {
  const s = uniqueSuffix();
  const root = `start-${s}/v1`;
  const key = `demo-${s}`;
  let db: TestDatabase;
  let broker: EmbeddedBroker;
  let local: { ingest: LocalCredential; publisher: LocalCredential };
  let worker: IngestWorker;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(key));
    ({ broker, local } = await startStoreBroker(db.pool, { preferredPort: 0, topicRoot: root }));
    worker = await signedInWorker(db, { mqttUrl: broker.url, username: local.ingest.username, password: local.ingest.password, clientId: `worker-${s}`, topicRoot: root });
  });
  afterAll(async () => {
    await worker?.stop();
    await broker?.stop();
    await db?.drop();
  });

  it('refuses an anonymous client, and carries the demo publisher to the worker', async () => {
    await expect(mqtt.connectAsync(broker.url, { clientId: `anon-${s}`, protocolVersion: 4, reconnectPeriod: 0 })).rejects.toThrow(/Not authorized/);
    const demo = await mqtt.connectAsync(broker.url, { clientId: `demo-${s}`, protocolVersion: 4, username: local.publisher.username, password: local.publisher.password });
    try {
      await demo.publishAsync(`${root}/${key}/station`, stationRecord(7), { qos: 1 });
      await waitFor(async () => (await storedMinutes(db, key)).includes(7), 15_000, 'the demo record');
    } finally {
      await demo.endAsync();
    }
  });
});
