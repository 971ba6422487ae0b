import mqtt, { type IClientOptions, type MqttClient } from 'mqtt';
import type { Logger } from '../lib/log/logger';

export interface SubscriberOptions {
  url: string;
  clientId: string;
  username?: string;
  password?: string;
  topics: string[];
  /** Resolves once the message is committed; only then is it acknowledged. */
  onMessage(topic: string, payload: Buffer): Promise<void>;
  log: Logger;
}

/** How long the broker keeps our session (and queued QoS 1 messages) while we are away. */
const SESSION_EXPIRY_S = 7 * 24 * 3600;
const RETRY_MIN_MS = 500;
const RETRY_MAX_MS = 30_000;

/**
 * One small class around mqtt.js. QoS 1 with a persistent session (fixed
 * client id, clean start off), so the broker keeps messages while the worker
 * is down. A message is acknowledged only after `onMessage` resolves; while it
 * fails (database down) it is retried with backoff and the connection reads
 * nothing more — back-pressure lands on the broker, which holds the rest.
 * Speaks MQTT 5 where the broker does, 3.1.1 otherwise.
 */
export class TelemetrySubscriber {
  private client?: MqttClient;
  private stopping = false;
  private disconnectedSince?: number;
  private disconnectTimer?: NodeJS.Timeout;
  protocolVersion: 4 | 5 = 5;

  constructor(private readonly options: SubscriberOptions) {}

  get connected(): boolean {
    return this.client?.connected ?? false;
  }

  async start(): Promise<void> {
    try {
      this.client = await this.connect(5);
    } catch (error) {
      if (!/protocol/i.test((error as Error).message)) throw error;
      this.options.log.info('broker does not speak MQTT 5; using MQTT 3.1.1');
      this.client = await this.connect(4);
    }
    this.protocolVersion = this.client.options.protocolVersion === 5 ? 5 : 4;
    await this.client.subscribeAsync(this.options.topics, { qos: 1 });
    this.options.log.info(`subscribed to ${this.options.topics.join(', ')} (MQTT ${this.protocolVersion === 5 ? '5' : '3.1.1'})`);
  }

  private async connect(protocolVersion: 4 | 5): Promise<MqttClient> {
    const { url, clientId, username, password, log } = this.options;
    const options: IClientOptions = {
      clientId,
      username,
      password,
      clean: false,
      protocolVersion,
      reconnectPeriod: 2_000,
      connectTimeout: 10_000,
      resubscribe: true,
      ...(protocolVersion === 5 ? { properties: { sessionExpiryInterval: SESSION_EXPIRY_S } } : {}),
    };
    const client = await mqtt.connectAsync(url, options, false);
    client.handleMessage = (packet, done) => {
      this.deliver(packet.topic, packet.payload as Buffer).then(() => done(), done);
    };
    client.on('close', () => this.markDisconnected());
    client.on('connect', () => this.markConnected());
    client.on('error', (error) => log.warn(`broker: ${error.message}`));
    return client;
  }

  private async deliver(topic: string, payload: Buffer): Promise<void> {
    let wait = RETRY_MIN_MS;
    for (;;) {
      try {
        await this.options.onMessage(topic, payload);
        return;
      } catch (error) {
        if (this.stopping) throw error; // not acknowledged: the broker redelivers it
        this.options.log.warn(`storing a message from ${topic} failed (${(error as Error).message}); retrying in ${wait} ms`);
        await new Promise((r) => setTimeout(r, wait));
        wait = Math.min(wait * 2, RETRY_MAX_MS);
      }
    }
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

  async stop(): Promise<void> {
    this.stopping = true;
    clearInterval(this.disconnectTimer);
    await this.client?.endAsync();
  }
}
