/**
 * Axis ranges. A chart's value axis starts at 0 for magnitudes (errors,
 * hours, counts) so bar heights and line heights compare honestly, and ends
 * at a round number a little above the largest value or reference line, so
 * a watch circle drawn as a reference line is always inside the chart.
 */

const NICE = [1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10];

/** The smallest "round" number ≥ x (x > 0): 1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8 × 10^k. */
export function niceCeil(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return 1;
  const power = 10 ** Math.floor(Math.log10(x));
  const scaled = x / power;
  // A small tolerance: 3.0000000004 is 3, not 4.
  const step = NICE.find((n) => n >= scaled - 1e-9) ?? 10;
  return step * power;
}

/** [0, nice max] covering every value and reference, with 5 % headroom. */
export function zeroBasedDomain(values: Iterable<number | null>, references: readonly number[] = []): [number, number] {
  let max = 0;
  for (const v of values) if (v !== null && Number.isFinite(v) && v > max) max = v;
  for (const r of references) if (Number.isFinite(r) && r > max) max = r;
  return [0, max > 0 ? niceCeil(max * 1.05) : 1];
}

/** A domain symmetric about 0 that covers |values| and the references: for north/east offsets. */
export function symmetricDomain(values: Iterable<number>, references: readonly number[] = []): [number, number] {
  let max = 0;
  for (const v of values) if (Number.isFinite(v)) max = Math.max(max, Math.abs(v));
  for (const r of references) if (Number.isFinite(r)) max = Math.max(max, Math.abs(r));
  const m = max > 0 ? niceCeil(max * 1.05) : 1;
  return [-m, m];
}
