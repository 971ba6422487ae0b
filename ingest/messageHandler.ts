import type { Pool, PoolClient } from 'pg';
import { parsePayload, type Rejection } from '../lib/telemetry/parsePayload';
import { parseTopic } from '../lib/telemetry/topic';
import { forgetKnownPartitions, writeBatches } from './storeWriter';
import type { VesselDirectory } from './vesselDirectory';

/** Quarantined payloads are cut to this many characters (docs/telemetry.md). */
export const QUARANTINE_PAYLOAD_CHARS = 65_536;

export interface HandleResult {
  inserted: number;
  duplicates: number;
  quarantined: number;
}

export interface IngestCounters extends HandleResult {
  messages: number;
  byReason: Record<string, number>;
}

interface Quarantined extends Rejection {
  vesselKey?: string;
  stream?: string;
}

/**
 * Turns one MQTT message into stored rows and quarantined rejections, in one
 * transaction: when `handle` resolves, everything in the message is committed
 * and the message may be acknowledged.
 */
export class MessageHandler {
  readonly counters: IngestCounters = { messages: 0, inserted: 0, duplicates: 0, quarantined: 0, byReason: {} };

  constructor(
    private readonly pool: Pool,
    private readonly vessels: VesselDirectory,
    private readonly options: { topicRoot: string; fleetTimeZone: string },
  ) {}

  async handle(topic: string, payload: Buffer, now = new Date()): Promise<HandleResult> {
    const { rejected, batch } = await this.read(topic, payload, now);
    const client = await this.pool.connect();
    try {
      await client.query('BEGIN');
      const written = batch ? await writeBatches(client, [batch], this.options.fleetTimeZone) : { inserted: 0, duplicates: 0 };
      await quarantine(client, topic, rejected);
      await client.query('COMMIT');
      const result = { ...written, quarantined: rejected.length };
      this.count(result, rejected);
      return result;
    } catch (error) {
      await client.query('ROLLBACK').catch(() => {});
      forgetKnownPartitions();
      throw error;
    } finally {
      client.release();
    }
  }

  private async read(topic: string, payload: Buffer, now: Date) {
    const where = parseTopic(this.options.topicRoot, topic);
    const whole = (r: Omit<Quarantined, 'payload'>) => ({
      rejected: [{ ...r, payload: payload.subarray(0, QUARANTINE_PAYLOAD_CHARS).toString('utf8') }],
      batch: undefined,
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
    const parsed = parsePayload(where.stream, payload, now);
    return {
      rejected: parsed.rejected.map((r) => ({ ...r, vesselKey: where.vessel, stream: where.stream })),
      batch: parsed.records.length ? { stream: where.stream, vesselId, records: parsed.records } : undefined,
    };
  }

  private count(result: HandleResult, rejected: Quarantined[]) {
    this.counters.messages += 1;
    this.counters.inserted += result.inserted;
    this.counters.duplicates += result.duplicates;
    this.counters.quarantined += result.quarantined;
    for (const r of rejected) this.counters.byReason[r.reason] = (this.counters.byReason[r.reason] ?? 0) + 1;
  }
}

async function quarantine(client: PoolClient, topic: string, rejected: Quarantined[]) {
  if (rejected.length === 0) return;
  await client.query(
    `INSERT INTO quarantine (topic, vessel_key, stream, reason, detail, payload)
     SELECT $1, * FROM unnest($2::text[], $3::text[], $4::text[], $5::text[], $6::text[])`,
    [
      topic,
      rejected.map((r) => r.vesselKey ?? null),
      rejected.map((r) => r.stream ?? null),
      rejected.map((r) => r.reason),
      rejected.map((r) => r.detail),
      rejected.map((r) =>
        (typeof r.payload === 'string' ? r.payload : JSON.stringify(r.payload) ?? String(r.payload)).slice(
          0,
          QUARANTINE_PAYLOAD_CHARS,
        ),
      ),
    ],
  );
}
