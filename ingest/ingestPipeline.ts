import type { Pool } from 'pg';
import type { Logger } from '../lib/log/logger';
import type { MessageHandler } from './messageHandler';
import { prepareConnections, rendered, rowsIn, writeInTransaction, type PreparedMessage, type WriteResult } from './storeWriter';

export interface PipelineOptions {
  pool: Pool;
  handler: MessageHandler;
  fleetTimeZone: string;
  log: Logger;
  /** Flush as soon as this many rows wait. */
  maxBatchRows?: number;
  /**
   * Flush at the latest this long after the first message of a batch
   * arrived, ms (default 2). Short: batches grow by themselves while both
   * flushes are busy, and a publisher with a window of unacknowledged QoS 1
   * messages waits this long more for every window it sends (20 ms cost the
   * ingest benchmark's live run about a fifth of its speed).
   */
  lingerMs?: number;
  /** Stop reading from the broker while this many rows wait (back-pressure). */
  highWaterRows?: number;
  /** Flushes that may run at once (each on its own connection). */
  concurrency?: number;
  /** Told about every committed flush (metrics). */
  onFlush?: (flush: FlushReport) => void;
}

export interface FlushReport {
  messages: number;
  rows: number;
  /** Time from BEGIN to COMMIT, seconds. */
  commitSeconds: number;
  result: WriteResult;
  /** Per message with records: commit time minus its newest record's `t`, seconds. */
  lagSeconds: number[];
}

/** Commit time minus the newest record time of each message, seconds. */
function lags(messages: PreparedMessage[], committedAt: number): number[] {
  const out: number[] = [];
  for (const m of messages) {
    const newest = m.batch && rendered(m.batch).newest;
    if (newest) out.push((committedAt - Date.parse(newest)) / 1000);
  }
  return out;
}

interface Waiting {
  message: PreparedMessage;
  rows: number;
  resolve: () => void;
  reject: (error: Error) => void;
}

export interface Submitted {
  /** Resolves when the message is committed (stored and/or quarantined). */
  committed: Promise<void>;
  /** Resolves when there is room for more messages. */
  ready: Promise<void>;
}

const RETRY_MIN_MS = 250;
const RETRY_MAX_MS = 30_000;

/**
 * A refusal of the data itself — PostgreSQL error classes 22 (data exception)
 * and 23 (integrity constraint violation): retrying the same rows cannot
 * help. Anything else (connection loss, shutdown, overload, a missing
 * relation) is retried with backoff, never quarantined: it is not the data's
 * fault, and quarantining valid records would lose them.
 */
function isDataRefusal(error: unknown): boolean {
  return /^2[23]/.test((error as { code?: string }).code ?? '');
}

const rowsOf = (m: PreparedMessage) => rowsIn(m.batch) + m.rejected.length;

/**
 * Batches messages into few transactions: messages wait in a buffer that is
 * written (COPY into staging, then INSERT … ON CONFLICT DO NOTHING) when it
 * holds `maxBatchRows` rows or `lingerMs` after its first message, with up
 * to `concurrency` flushes at once (with duplicates in flight at the same
 * time, the copy committed first is the one kept). While the database is away a flush is retried with backoff and
 * the buffer fills until `ready` holds the reader back. A flush that fails
 * for a reason a retry cannot cure is split into single messages, and a
 * message the store refuses on its own is quarantined as `store_rejected`.
 */
export class IngestPipeline {
  private buffer: Waiting[] = [];
  private bufferedRows = 0;
  private rowsInFlight = 0;
  /** Flushes in progress; up to `concurrency` run at once, on their own connections. */
  private readonly flushing = new Set<Promise<void>>();
  private lingerTimer?: NodeJS.Timeout;
  private readChain: Promise<unknown> = Promise.resolve();
  private roomWaiters: (() => void)[] = [];
  private stopping = false;
  private readonly maxBatchRows: number;
  private readonly lingerMs: number;
  private readonly highWaterRows: number;
  private readonly concurrency: number;

  constructor(private readonly options: PipelineOptions) {
    this.maxBatchRows = options.maxBatchRows ?? 20_000;
    this.lingerMs = options.lingerMs ?? 2;
    this.highWaterRows = options.highWaterRows ?? 60_000;
    this.concurrency = options.concurrency ?? 2;
  }

  /** Get the connections of the first flushes ready (best effort: a flush can do it itself). */
  async prepare(): Promise<void> {
    try {
      await prepareConnections(this.options.pool, this.concurrency);
    } catch (error) {
      this.options.log.warn(`could not prepare the store's connections ahead (${(error as Error).message}); the first flushes will`);
    }
  }

  get depth(): { messages: number; rows: number } {
    return { messages: this.buffer.length, rows: this.waitingRows() };
  }

  submit(topic: string, payload: Buffer, now = new Date()): Submitted {
    // Reads run one after another so a batch keeps arrival order ("first copy wins").
    const prepared = this.readChain.then(() => this.readWithRetry(topic, payload, now));
    // A failed read (database away during a vessel look-up) must not block the reads after it.
    this.readChain = prepared.catch(() => {});
    const committed = prepared.then(
      (message) =>
        new Promise<void>((resolve, reject) => {
          const rows = rowsOf(message);
          this.buffer.push({ message, rows, resolve, reject });
          this.bufferedRows += rows;
          this.schedule();
        }),
    );
    const ready = prepared.then(() => this.room());
    return { committed, ready };
  }

  /** A vessel look-up can meet a database that is away: retry it like a flush. */
  private async readWithRetry(topic: string, payload: Buffer, now: Date): Promise<PreparedMessage> {
    let wait = RETRY_MIN_MS;
    for (;;) {
      try {
        return await this.options.handler.read(topic, payload, now);
      } catch (error) {
        if (this.stopping) throw error;
        this.options.log.warn(`reading a message failed (${(error as Error).message}); retrying in ${wait} ms`);
        await new Promise((r) => setTimeout(r, wait));
        wait = Math.min(wait * 2, RETRY_MAX_MS);
      }
    }
  }

  /** Write everything still buffered; resolves when all of it is committed. */
  async drain(): Promise<void> {
    await this.readChain.catch(() => {});
    while (this.buffer.length > 0 || this.flushing.size > 0) {
      clearTimeout(this.lingerTimer);
      this.lingerTimer = undefined;
      while (this.buffer.length > 0 && this.flushing.size < this.concurrency) this.startFlush();
      await Promise.race(this.flushing);
    }
  }

  /** Stop retrying: what is still buffered is rejected (its messages stay unacknowledged). */
  abandon(): void {
    this.stopping = true;
    for (const w of this.buffer.splice(0)) w.reject(new Error('ingest stopped before this message was stored'));
    this.bufferedRows = this.rowsInFlight;
    this.wakeRoomWaiters();
  }

  private room(): Promise<void> {
    if (this.bufferedRows < this.highWaterRows) return Promise.resolve();
    return new Promise((resolve) => this.roomWaiters.push(resolve));
  }

  private wakeRoomWaiters() {
    if (this.bufferedRows >= this.highWaterRows && !this.stopping) return;
    for (const wake of this.roomWaiters.splice(0)) wake();
  }

  private schedule() {
    if (this.flushing.size >= this.concurrency || this.buffer.length === 0) return;
    if (this.waitingRows() >= this.maxBatchRows) {
      clearTimeout(this.lingerTimer);
      this.lingerTimer = undefined;
      this.startFlush();
    } else if (!this.lingerTimer) {
      this.lingerTimer = setTimeout(() => {
        this.lingerTimer = undefined;
        if (this.flushing.size < this.concurrency) this.startFlush();
      }, this.lingerMs);
    }
  }

  /** Rows buffered and not yet taken by a flush. */
  private waitingRows(): number {
    return this.bufferedRows - this.rowsInFlight;
  }

  private startFlush() {
    const batch: Waiting[] = [];
    let rows = 0;
    while (this.buffer.length > 0 && (batch.length === 0 || rows + this.buffer[0]!.rows <= this.maxBatchRows)) {
      const w = this.buffer.shift()!;
      batch.push(w);
      rows += w.rows;
    }
    if (batch.length === 0) return;
    this.rowsInFlight += rows;
    const flush: Promise<void> = this.flush(batch)
      .catch((error: Error) => {
        // flush() settles every message itself; this is the last line of defence.
        this.options.log.error(`a flush failed unexpectedly: ${error.message}`);
        for (const w of batch) w.reject(error);
      })
      .finally(() => {
        this.rowsInFlight -= rows;
        this.bufferedRows -= rows;
        this.flushing.delete(flush);
        this.wakeRoomWaiters();
        this.schedule();
      });
    this.flushing.add(flush);
  }

  private async flush(batch: Waiting[]): Promise<void> {
    let wait = RETRY_MIN_MS;
    for (;;) {
      try {
        await this.commit(batch.map((w) => w.message), batch.reduce((n, w) => n + w.rows, 0));
        for (const w of batch) w.resolve();
        return;
      } catch (error) {
        if (this.stopping) {
          for (const w of batch) w.reject(error as Error);
          return;
        }
        if (isDataRefusal(error)) return this.isolate(batch, error as Error);
        this.options.log.warn(`storing ${batch.length} message(s) failed (${(error as Error).message}); retrying in ${wait} ms`);
        await new Promise((r) => setTimeout(r, wait));
        wait = Math.min(wait * 2, RETRY_MAX_MS);
      }
    }
  }

  /** Write messages in one transaction, then count and report it. */
  private async commit(messages: PreparedMessage[], rows: number): Promise<void> {
    const started = performance.now();
    const result = await this.write(messages);
    const commitSeconds = (performance.now() - started) / 1000;
    this.options.handler.count(messages, result);
    const report = this.options.onFlush;
    report?.({ messages: messages.length, rows, commitSeconds, result, lagSeconds: lags(messages, Date.now()) });
  }

  /** Retry the messages one by one, so one the store refuses cannot hold up the rest. */
  private async isolate(batch: Waiting[], cause: Error): Promise<void> {
    this.options.log.warn(`a batch of ${batch.length} message(s) was refused (${cause.message}); storing them one by one`);
    for (const w of batch) {
      try {
        await this.commit([w.message], w.rows);
      } catch (error) {
        if (!isDataRefusal(error)) {
          // Not this message's fault (the database went away meanwhile): back to the retry path.
          await this.flush([w]);
          continue;
        }
        const refused = refusedMessage(w.message, error as Error);
        try {
          await this.commit([refused], rowsOf(refused));
        } catch (last) {
          // Not even the quarantine row could be written: leave the message
          // unacknowledged (the broker keeps it) and say so loudly.
          this.options.log.error(`a message from ${w.message.topic} could be neither stored nor quarantined: ${(last as Error).message}`);
          w.reject(last as Error);
          continue;
        }
      }
      w.resolve();
    }
  }

  private write(messages: PreparedMessage[]): Promise<WriteResult> {
    return writeInTransaction(this.options.pool, messages, this.options.fleetTimeZone);
  }
}

/** A message the store refused on its own: all of it goes to quarantine. */
function refusedMessage(message: PreparedMessage, error: Error): PreparedMessage {
  const topic = message.topic;
  return {
    topic,
    rejected: [
      ...message.rejected,
      ...(message.batch ? rendered(message.batch).records() : []).map((record, i) => ({
        reason: 'store_rejected' as const,
        detail: `records[${i}]: the store refused the message (${error.message})`,
        payload: record,
        topic,
        stream: message.batch!.stream,
      })),
    ],
  };
}
