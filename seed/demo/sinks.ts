import { createWriteStream, type WriteStream } from 'node:fs';
import { once } from 'node:events';
import mqtt, { type MqttClient } from 'mqtt';

/**
 * Where the demo's messages go: an MQTT broker (QoS 1, as a vessel gateway
 * publishes), an NDJSON file of `{"topic": …, "payload": …}` lines, or
 * nowhere (the benchmark). Each counts what it was given.
 */
export interface Sink {
  publish(topic: string, payload: string): Promise<void>;
  close(): Promise<void>;
  readonly messages: number;
  readonly bytes: number;
}

abstract class CountingSink implements Sink {
  messages = 0;
  bytes = 0;
  async publish(topic: string, payload: string): Promise<void> {
    this.messages++;
    this.bytes += payload.length;
    await this.send(topic, payload);
  }
  protected abstract send(topic: string, payload: string): Promise<void>;
  abstract close(): Promise<void>;
}

export interface MqttSinkOptions {
  url: string;
  username?: string;
  password?: string;
  clientId?: string;
  /** Publishes awaiting their PUBACK at once (default 16). */
  window?: number;
}

/** QoS 1 publishes; a publish resolves once the broker holds the message or the window has room. */
export class MqttSink extends CountingSink {
  private readonly inFlight = new Set<Promise<void>>();
  private failure?: Error;

  private constructor(
    private readonly client: MqttClient,
    private readonly window: number,
  ) {
    super();
  }

  static async connect(o: MqttSinkOptions): Promise<MqttSink> {
    const client = await mqtt.connectAsync(o.url, {
      clientId: o.clientId ?? `holdfast-demo-${process.pid}`,
      username: o.username,
      password: o.password,
      protocolVersion: 4,
      reconnectPeriod: 2_000,
    });
    return new MqttSink(client, o.window ?? 16);
  }

  protected async send(topic: string, payload: string): Promise<void> {
    if (this.failure) throw this.failure;
    const p: Promise<void> = this.client
      .publishAsync(topic, payload, { qos: 1 })
      .then(() => undefined)
      .catch((e: Error) => {
        this.failure ??= e;
      })
      .finally(() => this.inFlight.delete(p));
    this.inFlight.add(p);
    while (this.inFlight.size >= this.window) await Promise.race(this.inFlight);
  }

  async close(): Promise<void> {
    await Promise.all(this.inFlight);
    await this.client.endAsync();
    if (this.failure) throw this.failure;
  }
}

/** `{"topic": …, "payload": …}` per line; the payload is the message's JSON, so a line is valid JSON. */
export class NdjsonSink extends CountingSink {
  private readonly out: WriteStream;

  constructor(file: string) {
    super();
    this.out = createWriteStream(file);
  }

  protected async send(topic: string, payload: string): Promise<void> {
    if (!this.out.write(`{"topic":${JSON.stringify(topic)},"payload":${payload}}\n`)) await once(this.out, 'drain');
  }

  async close(): Promise<void> {
    await new Promise<void>((resolve, reject) => this.out.end((e?: Error | null) => (e ? reject(e) : resolve())));
  }
}

/** Counts and drops (bench:sim measures the simulation and packaging, not a broker). */
export class NullSink extends CountingSink {
  protected async send(): Promise<void> {}
  async close(): Promise<void> {}
}
