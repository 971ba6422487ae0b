import { addDays } from './fleetDay';

const DAY = /^\d{4}-\d{2}-\d{2}$/;

/** A real calendar day written YYYY-MM-DD. */
export function isDay(text: string): boolean {
  if (!DAY.test(text)) return false;
  const date = new Date(`${text}T00:00:00Z`);
  return !Number.isNaN(date.getTime()) && date.toISOString().startsWith(text);
}

/** Every day from `from` to `to`, both included; throws on bad input. */
export function daysBetween(from: string, to: string, maxDays = 3660): string[] {
  if (!isDay(from)) throw new RangeError(`--from: "${from}" is not a day YYYY-MM-DD`);
  if (!isDay(to)) throw new RangeError(`--to: "${to}" is not a day YYYY-MM-DD`);
  if (from > to) throw new RangeError(`--from ${from} is after --to ${to}`);
  const days: string[] = [];
  for (let d = from; d <= to; d = addDays(d, 1)) {
    days.push(d);
    if (days.length > maxDays) throw new RangeError(`more than ${maxDays} days from ${from} to ${to}`);
  }
  return days;
}
