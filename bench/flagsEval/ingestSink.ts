import { IngestPipeline } from '../../ingest/ingestPipeline';
import { MessageHandler } from '../../ingest/messageHandler';
import { VesselDirectory } from '../../ingest/vesselDirectory';
import type { Pool } from '../../lib/db/pool';
import type { Logger } from '../../lib/log/logger';
import type { Sink } from '../../seed/demo/sinks';

/**
 * A demo sink that hands each message straight to the ingest worker's own
 * pipeline (validation, batching, COPY, dirty-day marks) without a broker:
 * the same rows as over MQTT, without the broker's cost on a 2-core machine.
 */
export class IngestSink implements Sink {
  messages = 0;
  bytes = 0;
  private readonly pipeline: IngestPipeline;
  private readonly committed: Promise<void>[] = [];

  constructor(pool: Pool, topicRoot: string, fleetTimeZone: string, log: Logger) {
    const handler = new MessageHandler(pool, new VesselDirectory(pool), { topicRoot, fleetTimeZone });
    this.pipeline = new IngestPipeline({ pool, handler, fleetTimeZone, log });
  }

  async publish(topic: string, payload: string): Promise<void> {
    const submitted = this.pipeline.submit(topic, Buffer.from(payload));
    // A failed commit must fail the run, not vanish: keep every promise.
    this.committed.push(submitted.committed);
    this.messages++;
    this.bytes += payload.length;
    await submitted.ready;
  }

  /** Resolves when every message is committed. */
  async close(): Promise<void> {
    await this.pipeline.drain();
    await Promise.all(this.committed);
  }
}
