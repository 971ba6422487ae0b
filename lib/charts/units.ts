/**
 * Units of the figures the pages draw (metrics-v1 units), and the one way an
 * axis label is written: "Quantity (unit)". Every axis of every chart goes
 * through `axisLabel`, so a label without a unit cannot be made.
 */
export const UNIT = {
  metre: 'm',
  metrePerSecond: 'm/s',
  degree: '°',
  hour: 'h',
  minute: 'min',
  percent: '%',
  /** A ratio to an expected value: 1 means "as expected". */
  ratio: '× expected',
  perDpDay: 'per DP day',
  count: 'count',
  efficiency: 'kN/kW^⅔',
  weight: '0–1',
} as const;

export type Unit = (typeof UNIT)[keyof typeof UNIT];

export function axisLabel(quantity: string, unit: Unit): string {
  return `${quantity} (${unit})`;
}
