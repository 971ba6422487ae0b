import type { Pool } from 'pg';
import type { Logger } from '../lib/log/logger';
import { IngestMetrics } from '../lib/observability/ingestMetrics';
import { IngestPipeline } from './ingestPipeline';
import { MessageHandler } from './messageHandler';
import { TelemetrySubscriber } from './mqttSubscriber';
import { ingestHealthCheck, type Health } from './statusServer';
import { VesselDirectory } from './vesselDirectory';

export interface IngestWorkerOptions {
  pool: Pool;
  mqttUrl: string;
  mqttUsername?: string;
  mqttPassword?: string;
  clientId: string;
  topicRoot: string;
  /**
   * Subscribe as a member of this shared-subscription group
   * (`$share/{group}/{root}/+/+`): the broker hands each message to one
   * member, so several workers split one fleet's traffic.
   */
  sharedGroup?: string;
  fleetTimeZone: string;
  log: Logger;
  /** Add Node's process metrics (memory, CPU, event loop) to `metrics` (default true). */
  processMetrics?: boolean;
  /** Rows per write transaction (default 20,000). */
  batchRows?: number;
  /** Rows held in memory before the worker stops reading (default 60,000). */
  bufferRows?: number;
}

const STATS_EVERY_MS = 60_000;

/** The topic filter the worker subscribes to. */
export function subscriptionFor(topicRoot: string, sharedGroup?: string): string {
  const filter = `${topicRoot}/+/+`;
  return sharedGroup ? `$share/${sharedGroup}/${filter}` : filter;
}

/** The ingest worker: subscriber → validation → store, acknowledged after commit. */
export class IngestWorker {
  readonly handler: MessageHandler;
  readonly pipeline: IngestPipeline;
  readonly subscriber: TelemetrySubscriber;
  readonly metrics: IngestMetrics;
  /** Broker connected and database answering (the status server's /healthz). */
  readonly health: () => Promise<Health>;
  private statsTimer?: NodeJS.Timeout;

  constructor(private readonly options: IngestWorkerOptions) {
    const vessels = new VesselDirectory(options.pool);
    this.handler = new MessageHandler(options.pool, vessels, {
      topicRoot: options.topicRoot,
      fleetTimeZone: options.fleetTimeZone,
    });
    // The sources are read lazily (at flushes and scrapes), after construction.
    this.metrics = new IngestMetrics(
      {
        totals: () => this.handler.counters,
        bufferRows: () => this.pipeline.depth.rows,
        unacknowledged: () => this.subscriber.unacknowledged,
        brokerConnected: () => this.subscriber.connected,
      },
      { processMetrics: options.processMetrics },
    );
    this.pipeline = new IngestPipeline({
      pool: options.pool,
      handler: this.handler,
      fleetTimeZone: options.fleetTimeZone,
      log: options.log,
      onFlush: (flush) => this.metrics.observeFlush(flush),
      maxBatchRows: options.batchRows,
      highWaterRows: options.bufferRows,
    });
    this.subscriber = new TelemetrySubscriber({
      url: options.mqttUrl,
      clientId: options.clientId,
      username: options.mqttUsername,
      password: options.mqttPassword,
      topics: [subscriptionFor(options.topicRoot, options.sharedGroup)],
      onMessage: (topic, payload) => this.pipeline.submit(topic, payload),
      log: options.log,
    });
    this.health = ingestHealthCheck({ pool: options.pool, subscriber: this.subscriber, pipeline: this.pipeline });
  }

  async start(): Promise<void> {
    // Before subscribing: a resumed session delivers its backlog at once.
    await this.pipeline.prepare();
    await this.subscriber.start();
    this.statsTimer = setInterval(() => this.logStats(), STATS_EVERY_MS);
    this.statsTimer.unref();
  }

  /** Running totals since start, and what waits right now. */
  private logStats(): void {
    const c = this.handler.counters;
    this.options.log.info('ingest totals', {
      messages: c.messages,
      stored: c.inserted,
      duplicates: c.duplicates,
      quarantined: c.quarantined,
      buffer_rows: this.pipeline.depth.rows,
      unacknowledged: this.subscriber.unacknowledged,
      broker_connected: this.subscriber.connected,
    });
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
