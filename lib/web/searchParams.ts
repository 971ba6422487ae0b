/**
 * Reading a page's URL search parameters (Next.js hands them over as
 * `string | string[] | undefined`). Unknown or malformed values fall back to
 * the default instead of failing the page: a hand-edited or stale link
 * still shows something sensible.
 */
export type RawSearchParams = Record<string, string | string[] | undefined>;

export function param(params: RawSearchParams, name: string): string | undefined {
  const v = params[name];
  const first = Array.isArray(v) ? v[0] : v;
  return first === undefined || first.trim() === '' ? undefined : first.trim();
}

export function choice<T extends string>(params: RawSearchParams, name: string, choices: readonly T[], fallback: T): T {
  const v = param(params, name);
  return v !== undefined && (choices as readonly string[]).includes(v) ? (v as T) : fallback;
}

export function positiveInt(params: RawSearchParams, name: string, fallback: number): number {
  const v = param(params, name);
  const n = v === undefined ? NaN : Number(v);
  return Number.isInteger(n) && n >= 1 ? n : fallback;
}

/** The query string of `values`, leaving out empty ones; "" when nothing is left. */
export function queryString(values: Record<string, string | number | undefined | null>): string {
  const search = new URLSearchParams();
  for (const [k, v] of Object.entries(values)) if (v !== undefined && v !== null && v !== '') search.set(k, String(v));
  const text = search.toString();
  return text ? `?${text}` : '';
}
