/**
 * A 30-day trend line small enough for a table cell, drawn as one SVG path
 * on the server: hundreds of rows on the fleet page would cost far more as
 * chart components. A day without a figure breaks the line (a new "M"
 * segment); a figure with no neighbour is drawn as a dot so it is not lost.
 */

export interface Sparkline {
  width: number;
  height: number;
  /** SVG path data; empty when there is no figure at all. */
  path: string;
  /** Isolated figures (both neighbours missing). */
  dots: { x: number; y: number }[];
  /** The y of `reference` (a watch circle), when it falls inside the range drawn. */
  referenceY: number | null;
  max: number;
  daysWithData: number;
}

// A tenth of a pixel is finer than any screen draws; fewer digits keep the fleet page small.
const r1 = (x: number) => Math.round(x * 10) / 10;

export function sparkline(
  values: readonly (number | null)[],
  options: { width?: number; height?: number; reference?: number | null } = {},
): Sparkline {
  const width = options.width ?? 96;
  const height = options.height ?? 24;
  const pad = 2;
  const present = values.filter((v): v is number => v !== null && Number.isFinite(v));
  // From 0 up: a trend of magnitudes, read against the watch circle line when it is in range.
  const max = Math.max(...present, options.reference ?? 0, 0) || 1;
  const x = (i: number) => r1(values.length <= 1 ? width / 2 : pad + ((width - 2 * pad) * i) / (values.length - 1));
  const y = (v: number) => r1(height - pad - ((height - 2 * pad) * v) / max);

  let path = '';
  const dots: { x: number; y: number }[] = [];
  values.forEach((v, i) => {
    if (v === null || !Number.isFinite(v)) return;
    const prev = i > 0 ? values[i - 1] : null;
    const next = i < values.length - 1 ? values[i + 1] : null;
    const joinedBefore = prev !== null && prev !== undefined && Number.isFinite(prev);
    const joinedAfter = next !== null && next !== undefined && Number.isFinite(next);
    if (!joinedBefore && !joinedAfter) dots.push({ x: x(i), y: y(v) });
    else path += `${joinedBefore ? 'L' : 'M'}${x(i)} ${y(v)}`;
  });
  const reference = options.reference;
  return {
    width,
    height,
    path,
    dots,
    referenceY: reference !== null && reference !== undefined && reference > 0 ? y(reference) : null,
    max,
    daysWithData: present.length,
  };
}
