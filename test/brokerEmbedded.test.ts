import mqtt, { type IClientOptions, type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { IngestWorker } from '../ingest/worker';
import { createIngestCredential, createVesselCredential, type IssuedCredential } from '../lib/broker/credentials';
import { startEmbeddedBroker, type EmbeddedBroker } from '../lib/broker/embedded';
import { localCredentials, storeBrokerAccess } from '../lib/broker/embeddedAccess';
import { signedInWorker, stationRecord, storedMinutes } from './brokerHelpers';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * Issue 8, "must show 2", with the embedded broker: a vessel's credentials
 * publishing on another vessel's topic are refused, and nothing is stored.
 * The broker checks the credentials in the store (as `holdfast vessel
 * credentials` makes them); a real ingest worker, signed in with the ingest
 * credentials, writes what gets through.
 */
describe('embedded broker with vessel credentials', () => {
  const s = uniqueSuffix();
  const root = `acl-${s}/v1`;
  const keyA = `tern-a-${s}`;
  const keyB = `tern-b-${s}`;
  const local = localCredentials();
  let db: TestDatabase;
  let broker: EmbeddedBroker;
  let worker: IngestWorker;
  let credA: IssuedCredential;
  let credB: IssuedCredential;
  let ingest: IssuedCredential;
  const clients: MqttClient[] = [];

  const connect = async (options: IClientOptions) => {
    const client = await mqtt.connectAsync(broker.url, { protocolVersion: 4, reconnectPeriod: 0, connectTimeout: 5_000, ...options });
    clients.push(client);
    return client;
  };
  const refusal = (options: IClientOptions) => connect(options).then(() => 'accepted', (e: Error) => e.message);
  const station = (minute: number) => stationRecord(minute);
  const closed = (client: MqttClient) => new Promise<void>((resolve) => client.once('close', () => resolve()));
  /** 'acknowledged' once the broker took it; 'closed' when it dropped the connection instead. */
  const publish = (client: MqttClient, topic: string, payload: string) =>
    Promise.race([client.publishAsync(topic, payload, { qos: 1 }).then(() => 'acknowledged'), closed(client).then(() => 'closed')]);
  /** The return code the SUBACK gives each filter (0x80 = refused, MQTT 3.1.1 section 3.9.3). */
  const granted = (client: MqttClient, filters: string[]) =>
    client.subscribeAsync(filters, { qos: 1 }).then(
      (grants) => grants.map((g) => g.qos as number),
      (e: Error & { packet?: { granted?: number[] } }) => {
        if (!e.packet?.granted) throw e;
        return e.packet.granted;
      },
    );
  const stored = (key: string) => storedMinutes(db, key);

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(keyA));
    await registerFleet(db.url, smallFleet(keyB));
    credA = await createVesselCredential(db.pool, keyA, { kind: 'cli' });
    credB = await createVesselCredential(db.pool, keyB, { kind: 'cli' });
    ingest = await createIngestCredential(db.pool, { kind: 'cli' });
    const access = storeBrokerAccess(db.pool, { topicRoot: root, local: [local.ingest, local.publisher], recheckEveryMs: 200 });
    broker = await startEmbeddedBroker(0, { access });
    worker = await signedInWorker(db, { mqttUrl: broker.url, username: ingest.username, password: ingest.password, clientId: `worker-${s}`, topicRoot: root });
  });
  afterAll(async () => {
    await Promise.all(clients.map((c) => c.endAsync(true).catch(() => {})));
    await worker?.stop();
    await broker?.stop();
    await db?.drop();
  });

  it('refuses clients without credentials or with wrong ones', async () => {
    expect(await refusal({ clientId: `anon-${s}` })).toMatch(/Not authorized/);
    expect(await refusal({ clientId: `wrong-${s}`, username: credA.username, password: credB.password })).toMatch(/Bad username or password/);
    expect(await refusal({ clientId: `ghost-${s}`, username: 'no-such-vessel', password: credA.password })).toMatch(/Bad username or password/);
    expect(await refusal({ clientId: `local-${s}`, username: local.ingest.username, password: ingest.password })).toMatch(/Bad username or password/);
  });

  it("stores a vessel's own records, refuses its records on another vessel's topic, and stores nothing of them", async () => {
    const a = await connect({ clientId: `a-${s}`, username: credA.username, password: credA.password });
    expect(await publish(a, `${root}/${keyA}/station`, station(1))).toBe('acknowledged');
    await waitFor(async () => (await stored(keyA)).length === 1, 15_000, "A's own record");

    // A forges a record for B: the broker drops the connection without acknowledging it.
    expect(await publish(a, `${root}/${keyB}/station`, station(2))).toBe('closed');

    // B's own record, published after the forgery, is stored; the forgery never is.
    const b = await connect({ clientId: `b-${s}`, username: credB.username, password: credB.password });
    expect(await publish(b, `${root}/${keyB}/station`, station(3))).toBe('acknowledged');
    await waitFor(async () => (await stored(keyB)).length === 1, 15_000, "B's own record");
    await new Promise((r) => setTimeout(r, 300));
    expect(await stored(keyB)).toEqual([3]);
    expect(await stored(keyA)).toEqual([1]);
    expect((await db.pool.query('SELECT count(*)::int AS n FROM quarantine')).rows[0].n).toBe(0);
    expect(worker.handler.counters.messages).toBe(2);
  });

  it('refuses deeper topics, other roots and $SYS to a vessel', async () => {
    for (const topic of [`${root}/${keyA}/station/extra`, `other/v1/${keyA}/station`, '$SYS/anything']) {
      const a = await connect({ clientId: `a-deep-${s}`, username: credA.username, password: credA.password });
      expect(await publish(a, topic, station(4)), topic).toBe('closed');
    }
  });

  it("gives a vessel no subscription, not even to its own topic, and lets it not take the worker's client id", async () => {
    const a = await connect({ clientId: `a-sub-${s}`, username: credA.username, password: credA.password });
    expect(await granted(a, [`${root}/+/+`, `${root}/${keyA}/station`, '#'])).toEqual([128, 128, 128]);
    // Taking over the worker's session would hand A the fleet's queued messages.
    expect(await refusal({ clientId: `worker-${s}`, username: credA.username, password: credA.password, clean: false })).toMatch(/Identifier rejected/);
    expect(worker.subscriber.connected).toBe(true);
  });

  it('lets the ingest credentials read but not publish', async () => {
    const w = await connect({ clientId: `w2-${s}`, username: ingest.username, password: ingest.password });
    expect(await granted(w, [`${root}/+/+`, '#'])).toEqual([1, 128]);
    expect(await publish(w, `${root}/${keyA}/station`, station(5))).toBe('closed');
  });

  it("lets the local demo publisher play every vessel, with this start's password only", async () => {
    const demo = await connect({ clientId: `demo-${s}`, username: local.publisher.username, password: local.publisher.password });
    expect(await publish(demo, `${root}/${keyA}/station`, station(6))).toBe('acknowledged');
    expect(await publish(demo, `${root}/${keyB}/station`, station(7))).toBe('acknowledged');
    await waitFor(async () => (await stored(keyB)).includes(7), 15_000, 'the demo records');
    expect(await refusal({ clientId: `demo2-${s}`, username: local.publisher.username, password: localCredentials().publisher.password })).toMatch(/Bad username or password/);
  });

  it('cuts a connected vessel off once its credentials are replaced, and refuses the old password', async () => {
    const old = await connect({ clientId: `a-old-${s}`, username: credA.username, password: credA.password });
    const cutOff = closed(old);
    const fresh = await createVesselCredential(db.pool, keyA, { kind: 'cli' });
    await Promise.race([cutOff, new Promise((_, reject) => setTimeout(() => reject(new Error('still connected after 5 s')), 5_000))]);
    expect(await refusal({ clientId: `a-old2-${s}`, username: credA.username, password: credA.password })).toMatch(/Bad username or password/);
    const renewed = await connect({ clientId: `a-new-${s}`, username: fresh.username, password: fresh.password });
    expect(await publish(renewed, `${root}/${keyA}/station`, station(8))).toBe('acknowledged');
    await waitFor(async () => (await stored(keyA)).includes(8), 15_000, 'the record sent with the new password');
  });
});
