import type { Pool } from 'pg';
import type { Logger } from '../lib/log/logger';
import { IngestPipeline } from './ingestPipeline';
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
  readonly pipeline: IngestPipeline;
  readonly subscriber: TelemetrySubscriber;
  private statsTimer?: NodeJS.Timeout;

  constructor(private readonly options: IngestWorkerOptions) {
    const vessels = new VesselDirectory(options.pool);
    this.handler = new MessageHandler(options.pool, vessels, {
      topicRoot: options.topicRoot,
      fleetTimeZone: options.fleetTimeZone,
    });
    this.pipeline = new IngestPipeline({
      pool: options.pool,
      handler: this.handler,
      fleetTimeZone: options.fleetTimeZone,
      log: options.log,
    });
    this.subscriber = new TelemetrySubscriber({
      url: options.mqttUrl,
      clientId: options.clientId,
      username: options.mqttUsername,
      password: options.mqttPassword,
      topics: [`${options.topicRoot}/+/+`],
      onMessage: (topic, payload) => this.pipeline.submit(topic, payload),
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

  /** Stop reading, store what was read, then disconnect (sending the last acknowledgements). */
  async stop(): Promise<void> {
    clearInterval(this.statsTimer);
    this.subscriber.pause();
    const drained = this.pipeline.drain();
    const gaveUp = new Promise<void>((resolve) => setTimeout(resolve, 10_000).unref());
    await Promise.race([drained, gaveUp]);
    this.pipeline.abandon();
    await this.subscriber.stop();
  }
}
