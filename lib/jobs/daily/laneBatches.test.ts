import { describe, expect, it } from 'vitest';
import { addDays } from '../../time/fleetDay';
import { laneBatches } from './laneBatches';

const fleet = (vessels: number, days: number) =>
  Array.from({ length: vessels * days }, (_, i) => ({ vesselId: 1 + Math.floor(i / days), day: addDays('2026-05-01', i % days) }));

const vesselsOf = (batch: { vesselId: number }[]) => new Set(batch.map((d) => d.vesselId));

describe('laneBatches', () => {
  it('keeps every vessel-day once, sorted by vessel then day', () => {
    const days = fleet(7, 13).reverse();
    const flat = laneBatches(days, 2, 20).flat();
    expect(flat).toEqual(fleet(7, 13));
  });

  it('gives two lanes an even number of batches of at most maxBatch, cut between vessels', () => {
    const batches = laneBatches(fleet(50, 10), 2, 100);
    expect(batches.length).toBe(6);
    for (const b of batches) expect(b.length).toBeLessThanOrEqual(100);
    for (let i = 1; i < batches.length; i++) {
      const shared = [...vesselsOf(batches[i]!)].filter((v) => vesselsOf(batches[i - 1]!).has(v));
      expect(shared).toEqual([]);
    }
    // Lanes finish together: the two halves differ by at most one vessel's days.
    const sizes = batches.map((b) => b.length);
    expect(Math.abs(sizes.slice(0, 3).reduce((a, b) => a + b) - sizes.slice(3).reduce((a, b) => a + b))).toBeLessThanOrEqual(10);
  });

  it('splits a vessel with more days than maxBatch', () => {
    const batches = laneBatches(fleet(1, 250), 2, 100);
    expect(batches.map((b) => b.length)).toEqual([63, 62, 63, 62]);
  });

  it('does not invent batches: fewer vessel-days than lanes, and none', () => {
    expect(laneBatches(fleet(1, 1), 2, 100).map((b) => b.length)).toEqual([1]);
    expect(laneBatches([], 2, 100)).toEqual([]);
  });
});
