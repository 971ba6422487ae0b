/**
 * Numbers as the pages write them. A figure that cannot be computed is shown
 * as an em dash with a reason nearby, never as 0; percentiles in the
 * contract's overflow bin read "≥ 10 m" (metrics-v1).
 */

export const MISSING = '—';

export function fixed(value: number | null | undefined, digits: number): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return MISSING;
  // Avoid "-0.0" for tiny negative values.
  const text = value.toLocaleString('en-GB', { minimumFractionDigits: digits, maximumFractionDigits: digits });
  return /^-0(\.0+)?$/.test(text) ? text.slice(1) : text;
}

export function withUnit(value: number | null | undefined, digits: number, unit: string): string {
  const text = fixed(value, digits);
  return text === MISSING ? text : `${text} ${unit}`;
}

/** A radial percentile: "1.23 m", "≥ 10 m", or the dash. */
export function metres(value: number | null | undefined, overflow?: boolean | null, digits = 2): string {
  if (overflow) return '≥ 10 m';
  return withUnit(value, digits, 'm');
}

export function percent(value: number | null | undefined, digits = 1): string {
  return withUnit(value, digits, '%');
}

export function count(value: number | null | undefined): string {
  return fixed(value, 0);
}

export function hours(value: number | null | undefined, digits = 1): string {
  return withUnit(value, digits, 'h');
}
