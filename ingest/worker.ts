import type { Pool } from 'pg';
import type { Logger } from '../lib/log/logger';
import { MessageHandler } from './messageHandler';
import { TelemetrySubscriber } from './mqttSubscriber';
import { VesselDirectory } from './vesselDirectory';

export interface IngestWorkerOptions {
  pool: Pool;
  mqttUrl: string;
  mqttUsername?: string;
  mqttPassword?: string;
  clientId: string;
  topicRoot: string;
  fleetTimeZone: string;
  log: Logger;
}

/** The ingest worker: subscriber → validation → store, acknowledged after commit. */
export class IngestWorker {
  readonly handler: MessageHandler;
  private readonly subscriber: TelemetrySubscriber;
  private statsTimer?: NodeJS.Timeout;

  constructor(private readonly options: IngestWorkerOptions) {
    const vessels = new VesselDirectory(options.pool);
    this.handler = new MessageHandler(options.pool, vessels, {
      topicRoot: options.topicRoot,
      fleetTimeZone: options.fleetTimeZone,
    });
    this.subscriber = new TelemetrySubscriber({
      url: options.mqttUrl,
      clientId: options.clientId,
      username: options.mqttUsername,
      password: options.mqttPassword,
      topics: [`${options.topicRoot}/+/+`],
      onMessage: async (topic, payload) => {
        await this.handler.handle(topic, payload);
      },
      log: options.log,
    });
  }

  async start(): Promise<void> {
    await this.subscriber.start();
    this.statsTimer = setInterval(() => {
      const c = this.handler.counters;
      this.options.log.info(
        `messages=${c.messages} stored=${c.inserted} duplicates=${c.duplicates} quarantined=${c.quarantined}`,
      );
    }, 60_000);
    this.statsTimer.unref();
  }

  async stop(): Promise<void> {
    clearInterval(this.statsTimer);
    await this.subscriber.stop();
  }
}
