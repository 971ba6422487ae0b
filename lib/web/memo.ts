/**
 * A small stale-while-revalidate cache for figures that are costly to read
 * and change slowly (fleet-wide thruster wear totals). A fresh value is
 * served as is; an old one is served at once while one refresh runs in the
 * background; a missing key (first call, or a new day) is loaded and awaited.
 * A failed background refresh keeps the old value and is retried on a later
 * call; a failed first load is thrown to the caller.
 */
export function staleWhileRevalidate<T>(ttlMs: number, load: (key: string) => Promise<T>, now: () => number = Date.now) {
  const entries = new Map<string, { value: T; at: number; refreshing: boolean }>();
  const loading = new Map<string, Promise<T>>();

  const fetchInto = (key: string): Promise<T> => {
    let pending = loading.get(key);
    if (!pending) {
      pending = load(key).then(
        (value) => {
          // Keep only the newest key: yesterday's figures are not wanted again.
          for (const k of entries.keys()) if (k !== key) entries.delete(k);
          entries.set(key, { value, at: now(), refreshing: false });
          loading.delete(key);
          return value;
        },
        (error: unknown) => {
          loading.delete(key);
          const entry = entries.get(key);
          if (entry) entry.refreshing = false;
          throw error;
        },
      );
      loading.set(key, pending);
    }
    return pending;
  };

  return async function get(key: string): Promise<T> {
    const entry = entries.get(key);
    if (!entry) return fetchInto(key);
    if (now() - entry.at > ttlMs && !entry.refreshing) {
      entry.refreshing = true;
      fetchInto(key).catch((error: unknown) => console.error('background refresh failed', error));
    }
    return entry.value;
  };
}
