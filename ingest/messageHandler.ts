import type { Pool } from 'pg';
import { parsePayload } from '../lib/telemetry/parsePayload';
import type { Stream } from '../lib/telemetry/schemas';
import { parseTopic } from '../lib/telemetry/topic';
import { recordBatch } from './recordBatch';
import {
  QUARANTINE_PAYLOAD_CHARS,
  writeInTransaction,
  type PreparedMessage,
  type WriteResult,
} from './storeWriter';
import type { VesselDirectory } from './vesselDirectory';

export interface HandleResult {
  inserted: number;
  duplicates: number;
  quarantined: number;
}

export interface IngestCounters extends HandleResult {
  messages: number;
  byReason: Record<string, number>;
  /** Rows stored and duplicates skipped, per stream. */
  byStream: Partial<Record<Stream, { inserted: number; duplicates: number }>>;
}

/**
 * Reads MQTT messages into what must be stored and what must be quarantined,
 * and keeps the worker's counters. `handle` stores one message on its own
 * (one transaction); the ingest pipeline batches many through `read`.
 */
export class MessageHandler {
  readonly counters: IngestCounters = { messages: 0, inserted: 0, duplicates: 0, quarantined: 0, byReason: {}, byStream: {} };

  constructor(
    private readonly pool: Pool,
    private readonly vessels: VesselDirectory,
    private readonly options: { topicRoot: string; fleetTimeZone: string },
  ) {}

  async handle(topic: string, payload: Buffer, now = new Date()): Promise<HandleResult> {
    const message = await this.read(topic, payload, now);
    const result = await writeInTransaction(this.pool, [message], this.options.fleetTimeZone);
    this.count([message], result);
    return { inserted: result.inserted, duplicates: result.duplicates, quarantined: result.quarantined };
  }

  /** Topic and payload → the records to store and the rejections to quarantine (no writes). */
  async read(topic: string, payload: Buffer, now: Date): Promise<PreparedMessage> {
    return storable(await this.prepare(topic, payload, now), payload);
  }

  private async prepare(topic: string, payload: Buffer, now: Date): Promise<PreparedMessage> {
    const where = parseTopic(this.options.topicRoot, topic);
    const whole = (r: { reason: PreparedMessage['rejected'][number]['reason']; vesselKey?: string; stream?: string; detail: string }) => ({
      topic,
      rejected: [{ ...r, topic, payload: payload.subarray(0, QUARANTINE_PAYLOAD_CHARS).toString('utf8') }],
    });
    if (!where.ok) {
      return whole({
        reason: where.reason,
        vesselKey: where.vessel,
        stream: where.stream,
        detail: where.reason === 'unknown_stream' ? `unknown stream "${where.stream}"` : `topic is not ${this.options.topicRoot}/{vessel}/{stream}`,
      });
    }
    const vesselId = await this.vessels.idOf(where.vessel);
    if (vesselId === undefined) {
      return whole({ reason: 'unknown_vessel', vesselKey: where.vessel, stream: where.stream, detail: `vessel "${where.vessel}" is not registered` });
    }
    const { stream } = where;
    const parsed = parsePayload(stream, payload, now);
    return {
      topic,
      rejected: parsed.rejected.map((r) => ({ ...r, topic, vesselKey: where.vessel, stream })),
      batch: parsed.records.length ? recordBatch(stream, vesselId, parsed.records, rereader(stream, payload, now)) : undefined,
    };
  }

  /** Add a committed flush of `messages` to the counters. */
  count(messages: PreparedMessage[], result: WriteResult): void {
    const c = this.counters;
    c.messages += messages.length;
    c.inserted += result.inserted;
    c.duplicates += result.duplicates;
    c.quarantined += result.quarantined;
    for (const m of messages) for (const r of m.rejected) c.byReason[r.reason] = (c.byReason[r.reason] ?? 0) + 1;
    for (const [stream, s] of Object.entries(result.byStream) as [Stream, { inserted: number; duplicates: number }][]) {
      const total = (c.byStream[stream] ??= { inserted: 0, duplicates: 0 });
      total.inserted += s.inserted;
      total.duplicates += s.duplicates;
    }
  }
}

/**
 * The records of a message, read again from its payload: they are needed
 * again only when the store refuses them, so a waiting message keeps its
 * payload bytes instead of its many small record objects.
 */
const rereader = (stream: Stream, payload: Buffer, now: Date) => () => parsePayload(stream, payload, now).records;

/** PostgreSQL text cannot hold U+0000: it would fail the whole write. */
const noNul = (s: string) => s.replaceAll('\u0000', '\uFFFD');

/**
 * Rejections as text the quarantine table accepts: without U+0000 (a raw
 * payload may hold it, and JSON.parse quotes the payload in its message), and
 * a record too deeply nested for JSON.stringify shown as the message text.
 */
function storable(message: PreparedMessage, payload: Buffer): PreparedMessage {
  if (message.rejected.length === 0) return message; // the usual case
  const text = (value: unknown): string => {
    if (typeof value === 'string') return value;
    try {
      return JSON.stringify(value) ?? String(value);
    } catch {
      return payload.subarray(0, QUARANTINE_PAYLOAD_CHARS).toString('utf8');
    }
  };
  return {
    ...message,
    rejected: message.rejected.map((r) => ({
      ...r,
      topic: noNul(r.topic),
      vesselKey: r.vesselKey === undefined ? undefined : noNul(r.vesselKey),
      stream: r.stream === undefined ? undefined : noNul(r.stream),
      detail: noNul(r.detail),
      payload: noNul(text(r.payload)),
    })),
  };
}
