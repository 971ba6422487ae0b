import { Counter, Gauge, Histogram, Registry, collectDefaultMetrics } from 'prom-client';
import type { RejectReason } from '../telemetry/parsePayload';
import { STREAMS, type Stream } from '../telemetry/schemas';

/** The worker's running totals (the ingest message handler's counters). */
export interface IngestTotals {
  messages: number;
  byReason: Record<string, number>;
  byStream: Partial<Record<Stream, { inserted: number; duplicates: number }>>;
}

/** What one committed flush tells the metrics (the ingest pipeline's FlushReport fits). */
export interface FlushObservation {
  /** Rows of the flush: records to store plus rejections to quarantine. */
  rows: number;
  commitSeconds: number;
  /** Per message with records: commit time minus its newest record time, seconds. */
  lagSeconds: number[];
}

/** Where the metrics read the worker's state at each scrape. */
export interface IngestSources {
  totals(): IngestTotals;
  bufferRows(): number;
  unacknowledged(): number;
  brokerConnected(): boolean;
}

/** Every quarantine reason, so each series exists (at 0) before its first rejection. */
const REASONS: Record<RejectReason, true> = {
  bad_topic: true,
  unknown_stream: true,
  unknown_vessel: true,
  payload_too_large: true,
  invalid_json: true,
  invalid_payload: true,
  too_many_records: true,
  invalid_record: true,
  non_finite_number: true,
  future_timestamp: true,
  store_rejected: true,
};

const HOUR = 3600;
const DAY = 24 * HOUR;

/**
 * The ingest worker's Prometheus metrics, on a registry of their own (not
 * prom-client's global one, so one process can hold several workers).
 *
 * Counters follow the message handler's totals: they are brought up to date
 * at every flush and at every scrape, so messages stored outside a reported
 * flush (the pipeline storing a refused batch one message at a time) are
 * counted too. Histograms come from the flush reports; gauges are read at
 * scrape time.
 */
export class IngestMetrics {
  readonly registry = new Registry();
  private readonly messages: Counter;
  private readonly stored: Counter<'stream'>;
  private readonly duplicates: Counter<'stream'>;
  private readonly rejected: Counter<'reason'>;
  private readonly batchRows: Histogram;
  private readonly commitSeconds: Histogram;
  private readonly lagSeconds: Histogram;
  /** Totals already added to the counters. */
  private readonly seen = {
    messages: 0,
    reasons: new Map<string, number>(),
    stored: new Map<string, number>(),
    duplicates: new Map<string, number>(),
  };

  constructor(
    private readonly sources: IngestSources,
    options: { processMetrics?: boolean } = {},
  ) {
    const registers = [this.registry];
    const collect = () => this.syncTotals();
    this.messages = new Counter({
      name: 'holdfast_ingest_messages_total',
      help: 'MQTT messages taken and committed (stored, quarantined or both).',
      registers,
      collect,
    });
    this.stored = new Counter({
      name: 'holdfast_ingest_rows_stored_total',
      help: 'Time-series rows stored, per stream (one per unit for per-unit streams).',
      labelNames: ['stream'],
      registers,
      collect,
    });
    this.duplicates = new Counter({
      name: 'holdfast_ingest_duplicates_total',
      help: 'Rows skipped because their key was already stored (redeliveries, resent backlogs), per stream.',
      labelNames: ['stream'],
      registers,
      collect,
    });
    this.rejected = new Counter({
      name: 'holdfast_ingest_rejected_total',
      help: 'Records or payloads quarantined, per reason.',
      labelNames: ['reason'],
      registers,
      collect,
    });
    for (const stream of STREAMS) {
      this.stored.inc({ stream }, 0);
      this.duplicates.inc({ stream }, 0);
    }
    for (const reason of Object.keys(REASONS)) this.rejected.inc({ reason }, 0);

    this.batchRows = new Histogram({
      name: 'holdfast_ingest_batch_rows',
      help: 'Rows per committed flush (records and quarantined rejections).',
      buckets: [1, 10, 50, 100, 500, 1_000, 2_500, 5_000, 10_000, 20_000, 50_000],
      registers,
    });
    this.commitSeconds = new Histogram({
      name: 'holdfast_ingest_commit_seconds',
      help: 'Time from BEGIN to COMMIT of a flush, seconds.',
      buckets: [0.001, 0.0025, 0.005, 0.01, 0.025, 0.05, 0.1, 0.25, 0.5, 1, 2.5, 5, 10, 30],
      registers,
    });
    this.lagSeconds = new Histogram({
      name: 'holdfast_ingest_lag_seconds',
      help: 'Commit time minus the newest record time of each message, seconds (backlogs arrive days late by design; clock skew below 0 counts as 0).',
      buckets: [1, 5, 15, 60, 5 * 60, 15 * 60, HOUR, 6 * HOUR, DAY, 3 * DAY, 7 * DAY, 30 * DAY],
      registers,
    });

    const buffer: Gauge = new Gauge({
      name: 'holdfast_ingest_buffer_rows',
      help: 'Rows read and waiting for a flush.',
      registers,
      collect: () => buffer.set(this.sources.bufferRows()),
    });
    const unacknowledged: Gauge = new Gauge({
      name: 'holdfast_ingest_unacknowledged_messages',
      help: 'Messages received whose acknowledgement waits for their commit.',
      registers,
      collect: () => unacknowledged.set(this.sources.unacknowledged()),
    });
    const connected: Gauge = new Gauge({
      name: 'holdfast_ingest_broker_connected',
      help: '1 while connected to the MQTT broker, else 0.',
      registers,
      collect: () => connected.set(this.sources.brokerConnected() ? 1 : 0),
    });

    if (options.processMetrics ?? true) collectDefaultMetrics({ register: this.registry });
  }

  /** Take a committed flush: its size, commit time and lags. */
  observeFlush(flush: FlushObservation): void {
    this.syncTotals();
    this.batchRows.observe(flush.rows);
    this.commitSeconds.observe(flush.commitSeconds);
    for (const lag of flush.lagSeconds) this.lagSeconds.observe(Math.max(0, lag));
  }

  get contentType(): string {
    return this.registry.contentType;
  }

  /** The Prometheus text exposition of every metric. */
  text(): Promise<string> {
    return this.registry.metrics();
  }

  /** Add to the counters what the totals gained since the last call. */
  private syncTotals(): void {
    const totals = this.sources.totals();
    const add = (counter: Counter<string>, seen: Map<string, number>, labels: Record<string, string>, key: string, total: number) => {
      const gained = total - (seen.get(key) ?? 0);
      if (gained > 0) {
        counter.inc(labels, gained);
        seen.set(key, total);
      }
    };
    if (totals.messages > this.seen.messages) {
      this.messages.inc(totals.messages - this.seen.messages);
      this.seen.messages = totals.messages;
    }
    for (const [stream, s] of Object.entries(totals.byStream)) {
      if (!s) continue;
      add(this.stored, this.seen.stored, { stream }, stream, s.inserted);
      add(this.duplicates, this.seen.duplicates, { stream }, stream, s.duplicates);
    }
    for (const [reason, n] of Object.entries(totals.byReason)) add(this.rejected, this.seen.reasons, { reason }, reason, n);
  }
}
