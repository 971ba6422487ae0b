import type { z } from 'zod';
import { fastRecord } from './fastRecord';
import { recordSchemas, type Stream, type TelemetryRecord } from './schemas';

/** Limits of the contract, and the one Holdfast adds (future timestamps). */
export const MAX_PAYLOAD_BYTES = 1024 * 1024;
export const MAX_RECORDS_PER_MESSAGE = 10_000;
export const MAX_FUTURE_MS = 5 * 60_000;

export type RejectReason =
  | 'bad_topic'
  | 'unknown_stream'
  | 'unknown_vessel'
  | 'payload_too_large'
  | 'invalid_json'
  | 'invalid_payload'
  | 'too_many_records'
  | 'invalid_record'
  | 'non_finite_number'
  | 'future_timestamp'
  /** Valid by the contract, but the database refused it (see the detail). */
  | 'store_rejected';

export interface Rejection {
  reason: RejectReason;
  detail: string;
  /** The offending record, or the whole payload text when no record could be read. */
  payload: unknown;
}

export interface ParsedPayload<S extends Stream> {
  records: TelemetryRecord[S][];
  rejected: Rejection[];
}

/** The contract's payload is UTF-8: invalid bytes are an error, not U+FFFD. A BOM is kept (and so is invalid JSON). */
const strictUtf8 = new TextDecoder('utf-8', { fatal: true, ignoreBOM: true });

const isNonFinite = (v: unknown) => typeof v === 'number' && !Number.isFinite(v);

/** The value at a zod issue path inside the raw record (undefined when the path does not exist). */
function valueAt(item: unknown, path: readonly PropertyKey[]): unknown {
  let v = item;
  for (const key of path) {
    if (v === null || typeof v !== 'object' || !Object.hasOwn(v, key)) return undefined;
    v = (v as Record<PropertyKey, unknown>)[key];
  }
  return v;
}

/**
 * One MQTT payload → its valid records and a rejection per bad one. A bad
 * record never takes the good records of the same batch with it.
 */
export function parsePayload<S extends Stream>(stream: S, payload: Buffer, now: Date): ParsedPayload<S> {
  const whole = (reason: RejectReason, detail: string): ParsedPayload<S> => ({
    records: [],
    rejected: [{ reason, detail, payload: payload.subarray(0, 65_536).toString('utf8') }],
  });
  if (payload.length > MAX_PAYLOAD_BYTES) {
    return whole('payload_too_large', `payload is ${payload.length} bytes; the limit is ${MAX_PAYLOAD_BYTES}`);
  }
  let text: string;
  try {
    text = strictUtf8.decode(payload);
  } catch {
    return whole('invalid_json', 'payload is not valid UTF-8');
  }
  let body: unknown;
  try {
    body = JSON.parse(text);
  } catch (error) {
    return whole('invalid_json', (error as Error).message);
  }
  if (typeof body !== 'object' || body === null || Array.isArray(body)) {
    return whole('invalid_payload', 'payload must be a record object or {"records": [...]}');
  }
  let items: unknown[];
  if ('records' in body) {
    const list = (body as { records: unknown }).records;
    if (!Array.isArray(list)) return whole('invalid_payload', '"records" must be an array');
    if (list.length > MAX_RECORDS_PER_MESSAGE) {
      return whole('too_many_records', `${list.length} records; the limit is ${MAX_RECORDS_PER_MESSAGE} per message`);
    }
    items = list;
  } else {
    items = [body];
  }

  const schema = recordSchemas[stream] as unknown as z.ZodType<TelemetryRecord[S]>;
  const latest = now.getTime() + MAX_FUTURE_MS;
  // How a rejection names its record: records[i] in a batch, else record.
  const indexed = items.length > 1 || 'records' in body;
  const result: ParsedPayload<S> = { records: [], rejected: [] };
  for (let index = 0; index < items.length; index++) {
    const item = items[index];
    // The hand-written check takes the usual well-formed record; zod names what is wrong with any other.
    let record = fastRecord(stream, item);
    if (record === undefined) {
      const parsed = schema.safeParse(item);
      if (!parsed.success) {
        result.rejected.push(invalid(item, parsed.error.issues, indexed ? `records[${index}]` : 'record'));
        continue;
      }
      record = parsed.data;
    }
    if (Date.parse(record.t) > latest) {
      result.rejected.push({
        reason: 'future_timestamp',
        detail: `${indexed ? `records[${index}]` : 'record'}.t: ${record.t} is more than ${MAX_FUTURE_MS / 60_000} minutes ahead of the shore clock`,
        payload: item,
      });
      continue;
    }
    result.records.push(record);
  }
  return result;
}

/** A record zod refused: any field of the contract holding ±Infinity (1e999 in JSON) makes it non_finite_number, named in the detail. */
function invalid(item: unknown, issues: z.core.$ZodIssue[], where: string): Rejection {
  const nonFinite = issues.find((i) => isNonFinite(valueAt(item, i.path)));
  const issue = nonFinite ?? issues[0]!;
  const path = issue.path.length ? `.${issue.path.join('.')}` : '';
  return { reason: nonFinite ? 'non_finite_number' : 'invalid_record', detail: `${where}${path}: ${issue.message}`, payload: item };
}
