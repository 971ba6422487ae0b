import type { VesselDay } from './computeBatch';

/**
 * Cut vessel-days into batches for `lanes` concurrent lanes: at most
 * `maxBatch` vessel-days each, and a batch count that is a multiple of the
 * lanes, so the lanes finish together instead of one computing the last
 * batch alone (500 vessel-days, 2 lanes: six batches of ~84, not five of
 * 100 with the fifth on its own). Batches end at vessel boundaries where one
 * is near, because each batch locks its vessels and two concurrent batches
 * sharing a vessel would run one after the other. Pure: no I/O.
 */
export function laneBatches(days: readonly VesselDay[], lanes: number, maxBatch: number): VesselDay[][] {
  const sorted = [...days].sort((a, b) => a.vesselId - b.vesselId || (a.day < b.day ? -1 : a.day > b.day ? 1 : 0));
  const n = sorted.length;
  if (n === 0) return [];
  const perRound = Math.max(1, Math.floor(lanes));
  const count = Math.min(n, Math.ceil(Math.ceil(n / maxBatch) / perRound) * perRound);
  const isVesselBoundary = (i: number) => i === n || sorted[i - 1]!.vesselId !== sorted[i]!.vesselId;
  const batches: VesselDay[][] = [];
  let start = 0;
  for (let k = 1; k <= count && start < n; k++) {
    const ideal = Math.max(start + 1, Math.min(start + maxBatch, Math.round((k * n) / count)));
    // The vessel boundary nearest the ideal end, within (start, start + maxBatch].
    let end = -1;
    for (let d = 0; end < 0 && d <= maxBatch; d++) {
      for (const i of [ideal - d, ideal + d]) {
        if (i > start && i <= Math.min(n, start + maxBatch) && isVesselBoundary(i)) {
          end = i;
          break;
        }
      }
    }
    // No boundary in reach (one vessel has more than maxBatch days): split it.
    if (end < 0) end = Math.min(n, ideal);
    batches.push(sorted.slice(start, end));
    start = end;
  }
  for (; start < n; start += maxBatch) batches.push(sorted.slice(start, start + maxBatch));
  return batches;
}
