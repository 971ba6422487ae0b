import mqtt, { type IClientOptions, type MqttClient, type Packet } from 'mqtt';
import type { Logger } from '../lib/log/logger';
import { AckQueue } from './ackQueue';
import { classifyBrokerError, retryAtStart } from './startupRetry';

export interface SubscriberOptions {
  url: string;
  clientId: string;
  username?: string;
  password?: string;
  topics: string[];
  /**
   * Take a message: `committed` resolves once it is stored (only then is it
   * acknowledged); `ready` once the next message may be read (back-pressure).
   */
  onMessage(topic: string, payload: Buffer): { committed: Promise<void>; ready: Promise<void> };
  log: Logger;
}

/** How long the broker keeps our session (and queued QoS 1 messages) while we are away. */
const SESSION_EXPIRY_S = 7 * 24 * 3600;
const RECONNECT_MS = 2_000;
type SendPacket = (packet: Packet, cb?: (error?: Error) => void, ...rest: unknown[]) => void;

/**
 * One small class around mqtt.js. QoS 1 with a persistent session (fixed
 * client id, clean start off), so the broker keeps messages while the worker
 * is down. Speaks MQTT 5 where the broker does, 3.1.1 otherwise.
 *
 * Acknowledge after commit, without reading one message at a time: mqtt.js
 * sends a PUBACK as soon as `handleMessage` calls back and reads nothing more
 * until then. Here `handleMessage` calls back once the message is buffered
 * (so reading goes on and messages batch up), and the PUBACK it triggers is
 * held in an AckQueue until the message is committed, then sent in arrival
 * order. This wraps mqtt.js's internal `_sendPacket` (mqtt 5.16, pinned);
 * test/ingestAck.test.ts proves no acknowledgement leaves before the commit.
 * When the buffer is full, the call back waits: back-pressure on the broker.
 */
export class TelemetrySubscriber {
  private client?: MqttClient;
  private stopping = false;
  private paused = false;
  private disconnectedSince?: number;
  private disconnectTimer?: NodeJS.Timeout;
  private readonly acks = new AckQueue();
  protocolVersion: 4 | 5 = 5;

  constructor(private readonly options: SubscriberOptions) {}

  get connected(): boolean {
    return this.client?.connected ?? false;
  }

  /** Messages received whose acknowledgement has not been sent yet. */
  get unacknowledged(): number {
    return this.acks.waiting;
  }

  /**
   * Connect and subscribe. A broker that is not there yet is waited for
   * (retries with backoff, a warning each); refused credentials end start-up
   * with one clear error (ingest/startupRetry.ts).
   */
  async start(): Promise<void> {
    this.client = await retryAtStart(() => this.connectAnyVersion(), {
      what: 'broker',
      setting: 'MQTT_USERNAME/MQTT_PASSWORD',
      classify: classifyBrokerError,
      log: this.options.log,
    });
    this.protocolVersion = this.client.options.protocolVersion === 5 ? 5 : 4;
    await this.client.subscribeAsync(this.options.topics, { qos: 1 });
    this.options.log.info(`subscribed to ${this.options.topics.join(', ')} (MQTT ${this.protocolVersion === 5 ? '5' : '3.1.1'})`);
  }

  private async connectAnyVersion(): Promise<MqttClient> {
    try {
      return await this.connect(5);
    } catch (error) {
      if (!/protocol/i.test((error as Error).message)) throw error;
      this.options.log.info('broker does not speak MQTT 5; using MQTT 3.1.1');
      return await this.connect(4);
    }
  }

  private async connect(protocolVersion: 4 | 5): Promise<MqttClient> {
    const { url, clientId, username, password, log } = this.options;
    const options: IClientOptions = {
      clientId,
      username,
      password,
      clean: false,
      protocolVersion,
      reconnectPeriod: 0, // the first attempt reports its error; see below
      connectTimeout: 10_000,
      resubscribe: true,
      // No table of all 65,536 message ids as ready-made Buffers (mqtt-packet builds one at the
      // first packet: 6 MB resident for the process's life, and 65,536 objects for every full GC).
      writeCache: false,
      ...(protocolVersion === 5 ? { properties: { sessionExpiryInterval: SESSION_EXPIRY_S } } : {}),
    };
    // Handlers go on before the connection opens: a broker resuming our
    // session redelivers unacknowledged messages right after CONNACK, and
    // mqtt.js's default handler would acknowledge them unstored.
    const client = mqtt.connect(url, { ...options, manualConnect: true });
    const internals = client as unknown as { _sendPacket: SendPacket };
    const send = internals._sendPacket.bind(client);
    internals._sendPacket = (packet, cb, ...rest) => {
      const id = (packet as { messageId?: number }).messageId;
      if (packet.cmd === 'puback' && id !== undefined && this.acks.hold(id, () => send(packet, () => {}, ...rest))) {
        cb?.(); // let mqtt.js read on; the PUBACK itself waits for the commit
        return;
      }
      send(packet, cb, ...rest);
    };
    client.handleMessage = (packet, done) => {
      // Paused (shutting down): neither take nor acknowledge; the broker keeps it.
      if (this.paused) return;
      const id = packet.qos > 0 ? packet.messageId : undefined;
      if (id !== undefined) this.acks.arrived(id);
      const { committed, ready } = this.options.onMessage(packet.topic, packet.payload as Buffer);
      committed.then(
        () => id !== undefined && this.acks.committed(id),
        (error: Error) => log.warn(`a message from ${packet.topic} was not stored (${error.message}); the broker will deliver it again`),
      );
      ready.then(() => done(), (error: Error) => done(error));
    };
    await new Promise<void>((resolve, reject) => {
      const fail = (error: Error) => {
        client.removeListener('connect', ok);
        client.removeListener('close', closed);
        client.end(true);
        reject(error);
      };
      // A socket error without a code (EHOSTUNREACH …) closes the connection without an 'error' event.
      const closed = () => fail(new Error('connection closed before the broker answered'));
      const ok = () => {
        client.removeListener('error', fail);
        client.removeListener('close', closed);
        client.options.reconnectPeriod = RECONNECT_MS; // from now on, reconnect by itself
        resolve();
      };
      client.once('connect', ok);
      client.once('error', fail);
      client.once('close', closed);
      client.connect();
    });
    client.on('close', () => this.markDisconnected());
    client.on('connect', () => this.markConnected());
    client.on('error', (error) => log.warn(`broker: ${error.message}`));
    return client;
  }

  private markDisconnected() {
    if (this.stopping || this.disconnectedSince !== undefined) return;
    this.disconnectedSince = Date.now();
    this.options.log.warn('disconnected from the broker; reconnecting');
    this.disconnectTimer = setInterval(() => {
      const s = Math.round((Date.now() - this.disconnectedSince!) / 1000);
      this.options.log.warn(`still disconnected from the broker after ${s} s`);
    }, 30_000);
  }

  private markConnected() {
    if (this.disconnectedSince === undefined) return;
    this.options.log.info('reconnected to the broker');
    this.disconnectedSince = undefined;
    clearInterval(this.disconnectTimer);
  }

  /** Take no more messages (those on the way stay with the broker, unacknowledged). */
  pause(): void {
    this.paused = true;
  }

  async stop(): Promise<void> {
    this.stopping = true;
    clearInterval(this.disconnectTimer);
    await this.client?.endAsync();
  }
}
