import { addDays } from '../time/fleetDay';
import { isDay } from '../time/dayRange';
import { ApiError } from './errors';

/**
 * Query parameters shared by the endpoints. Days are fleet days YYYY-MM-DD
 * (FLEET_TIME_ZONE); `from` and `to` are inclusive.
 */

/** Days in a range when `from` is not given: `to` and the 29 days before it. */
export const DEFAULT_RANGE_DAYS = 30;
/**
 * Longest range one request may ask for: a year, leap years included. It
 * bounds the rows of one answer (a vessel with 8 thrusters: under 3,000 rows
 * of thrusters/daily); ask for longer periods a year at a time.
 */
export const MAX_RANGE_DAYS = 366;

export interface DayRange {
  from: string;
  to: string;
}

function dayParam(search: URLSearchParams, name: 'from' | 'to'): string | undefined {
  const value = search.get(name);
  if (value === null) return undefined;
  if (!isDay(value)) throw new ApiError('invalid_day', `${name}: "${value.slice(0, 40)}" is not a day YYYY-MM-DD`);
  return value;
}

const daysInclusive = (from: string, to: string) =>
  Math.round((Date.parse(`${to}T00:00:00Z`) - Date.parse(`${from}T00:00:00Z`)) / 86_400_000) + 1;

/** `from`/`to`: `to` defaults to `today`, `from` to `to` − 29 days. */
export function parseDayRange(search: URLSearchParams, today: string): DayRange {
  const to = dayParam(search, 'to') ?? today;
  const from = dayParam(search, 'from') ?? addDays(to, -(DEFAULT_RANGE_DAYS - 1));
  if (from > to) throw new ApiError('invalid_range', `from ${from} is after to ${to}`);
  const days = daysInclusive(from, to);
  if (days > MAX_RANGE_DAYS) {
    throw new ApiError('range_too_long', `from ${from} to ${to} is ${days} days; at most ${MAX_RANGE_DAYS} per request`);
  }
  return { from, to };
}

/** A parameter that takes one of a fixed list of values, with a default. */
export function parseChoice<T extends string>(search: URLSearchParams, name: string, choices: readonly T[], fallback: T): T {
  const value = search.get(name);
  if (value === null) return fallback;
  if (!(choices as readonly string[]).includes(value)) {
    throw new ApiError('invalid_parameter', `${name}: "${value.slice(0, 40)}" is not one of ${choices.join(', ')}`);
  }
  return value as T;
}

export const FORMATS = ['json', 'csv'] as const;
export type Format = (typeof FORMATS)[number];

export function parseFormat(search: URLSearchParams): Format {
  return parseChoice(search, 'format', FORMATS, 'json');
}
