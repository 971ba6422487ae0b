/** Formatting of instants and ages for the pages (pure). */

/** ["2026-12-01", "22:39:00"] in UTC. */
export function utcParts(d: Date): [date: string, time: string] {
  const iso = d.toISOString();
  return [iso.slice(0, 10), iso.slice(11, 19)];
}

/** "42 s ago", "12 min ago", "5 h 3 min ago", "1 d 6 h ago", "12 d ago". */
export function formatAge(ms: number): string {
  const s = Math.max(0, Math.floor(ms / 1000));
  if (s < 60) return `${s} s ago`;
  const min = Math.floor(s / 60);
  if (min < 60) return `${min} min ago`;
  const h = Math.floor(min / 60);
  if (h < 24) return min % 60 === 0 ? `${h} h ago` : `${h} h ${min % 60} min ago`;
  const d = Math.floor(h / 24);
  if (d < 7 && h % 24 !== 0) return `${d} d ${h % 24} h ago`;
  return `${d} d ago`;
}
