/**
 * When a vessel counts as stale: no record for longer than this. Vessels
 * send a record per stream every interval (60 s by default), so a quarter of
 * an hour of silence means a link or gateway problem, not a slow interval.
 */
export const STALE_AFTER_MS = 15 * 60 * 1000;

export function isStale(lastSeen: Date | null, now: Date): boolean {
  return lastSeen === null || now.getTime() - lastSeen.getTime() > STALE_AFTER_MS;
}
