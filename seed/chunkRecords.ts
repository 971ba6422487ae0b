/**
 * Split records into `{"records": [...]}` payloads that each stay under the
 * contract's 1 MiB and 10,000-record limits.
 */
export function chunkRecords(records: readonly unknown[], maxBytes = 900_000, maxRecords = 10_000): string[] {
  return chunkRecordTexts(records.map((r) => JSON.stringify(r)), maxBytes, maxRecords);
}

/** The same for records already serialised (each a JSON object's text). */
export function chunkRecordTexts(texts: readonly string[], maxBytes = 900_000, maxRecords = 10_000): string[] {
  const payloads: string[] = [];
  let parts: string[] = [];
  let size = 0;
  const overhead = '{"records":[]}'.length;
  for (const text of texts) {
    if (parts.length > 0 && (size + text.length + 1 + overhead > maxBytes || parts.length >= maxRecords)) {
      payloads.push(`{"records":[${parts.join(',')}]}`);
      parts = [];
      size = 0;
    }
    parts.push(text);
    size += text.length + 1;
  }
  if (parts.length > 0) payloads.push(`{"records":[${parts.join(',')}]}`);
  return payloads;
}
