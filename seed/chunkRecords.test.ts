import { describe, expect, it } from 'vitest';
import { chunkRecords } from './chunkRecords';

describe('chunkRecords', () => {
  it('keeps every record, in order, within the byte and count limits', () => {
    const records = Array.from({ length: 2500 }, (_, i) => ({ i, pad: 'x'.repeat(i % 300) }));
    const payloads = chunkRecords(records, 50_000, 700);
    expect(payloads.length).toBeGreaterThan(3);
    const back = payloads.flatMap((p) => {
      expect(Buffer.byteLength(p)).toBeLessThanOrEqual(50_000);
      const list = JSON.parse(p).records as unknown[];
      expect(list.length).toBeLessThanOrEqual(700);
      return list;
    });
    expect(back).toEqual(records);
  });

  it('makes no payload for no records', () => {
    expect(chunkRecords([])).toEqual([]);
  });
});
