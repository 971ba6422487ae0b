/**
 * The fleet calendar day (YYYY-MM-DD) that an instant falls on in an IANA
 * time zone. A record belongs to the day of its interval start `t`.
 */
const formatters = new Map<string, Intl.DateTimeFormat>();

export function fleetDay(instant: Date | string, timeZone: string): string {
  let f = formatters.get(timeZone);
  if (!f) {
    // en-CA formats dates as YYYY-MM-DD.
    f = new Intl.DateTimeFormat('en-CA', { timeZone, year: 'numeric', month: '2-digit', day: '2-digit' });
    formatters.set(timeZone, f);
  }
  return f.format(typeof instant === 'string' ? new Date(instant) : instant);
}

/** Calendar arithmetic on YYYY-MM-DD days (no time zone involved). */
export function addDays(day: string, n: number): string {
  const d = new Date(`${day}T00:00:00Z`);
  d.setUTCDate(d.getUTCDate() + n);
  return d.toISOString().slice(0, 10);
}
