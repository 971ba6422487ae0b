import net from 'node:net';
import { Aedes } from 'aedes';
import mqtt, { type MqttClient } from 'mqtt';
import type { PoolClient } from 'pg';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { IngestWorker } from '../ingest/worker';
import { silentLogger } from '../lib/log/logger';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * Acknowledge after commit, seen from the broker: while the database cannot
 * take the rows, the worker sends no PUBACK; once they are committed, every
 * PUBACK goes, in order. An aedes broker in this process reports each ack.
 */
describe('ingest acknowledges a message only after it is committed', () => {
  const suffix = uniqueSuffix();
  const key = `ack-${suffix}`;
  const clientId = `holdfast-ack-${suffix}`;
  let db: TestDatabase;
  let broker: Aedes;
  let server: net.Server;
  let worker: IngestWorker;
  let publisher: MqttClient;
  const acks: number[] = [];

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(key));
    broker = await Aedes.createBroker();
    broker.on('ack', (packet, client) => {
      if (client.id === clientId && packet && 'messageId' in packet) acks.push(Date.now());
    });
    server = net.createServer(broker.handle);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const url = `mqtt://127.0.0.1:${(server.address() as net.AddressInfo).port}`;
    worker = new IngestWorker({ pool: db.pool, mqttUrl: url, clientId, topicRoot: 'fleet/v1', fleetTimeZone: 'UTC', log: silentLogger });
    await worker.start();
    publisher = await mqtt.connectAsync(url, { clientId: `pub-${suffix}` });
  });
  afterAll(async () => {
    await publisher?.endAsync();
    await worker?.stop();
    await new Promise<void>((resolve) => broker.close(() => server.close(() => resolve())));
    await db?.drop();
  });

  it('holds every PUBACK while the rows cannot be written, and sends them once they are committed', async () => {
    // A transaction holding an exclusive lock: the worker's INSERT waits on it.
    const locker: PoolClient = await db.pool.connect();
    await locker.query('BEGIN');
    await locker.query('LOCK TABLE ts_station IN ACCESS EXCLUSIVE MODE');

    for (let i = 0; i < 3; i++) {
      const record = { v: 1, t: `2026-11-20T10:0${i}:00Z`, dt: 60, mode: 'auto_position', dp_s: 60, n: 0 };
      await publisher.publishAsync(`fleet/v1/${key}/station`, JSON.stringify(record), { qos: 1 });
    }
    await waitFor(() => worker.subscriber.unacknowledged === 3, 5_000, 'three messages in flight');
    await new Promise((r) => setTimeout(r, 1_500));
    expect(acks).toEqual([]);

    const released = Date.now();
    await locker.query('COMMIT');
    locker.release();
    await waitFor(() => acks.length === 3, 10_000, 'three acknowledgements');
    expect(acks.every((t) => t >= released)).toBe(true);
    const stored = await db.pool.query('SELECT count(*)::int AS n FROM ts_station');
    expect(stored.rows[0].n).toBe(3);
    expect(worker.subscriber.unacknowledged).toBe(0);
  });
});
