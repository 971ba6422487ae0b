/**
 * What the prepare layer hands the drawing layer. Every decision (which
 * days, gaps, units, reference lines, marked windows, axis ranges) is made
 * before this point; the drawing components only map these fields onto
 * recharts elements.
 */

/** Colour roles; the stylesheet and the drawing layer map them to the palette. */
export type Tone = 'primary' | 'secondary' | 'tertiary' | 'quaternary' | 'quinary' | 'senary' | 'warning' | 'alarm' | 'muted';

export interface SeriesSpec {
  key: string;
  label: string;
  kind: 'line' | 'bar';
  tone: Tone;
  /** Unit of the values, for the tooltip ("m", "%"). */
  unit: string;
  /** Which y axis: left (default) or right. */
  axis?: 'left' | 'right';
  dashed?: boolean;
}

export interface ReferenceLineSpec {
  y: number;
  label: string;
  tone: Tone;
  axis?: 'left' | 'right';
}

/** A span of days marked on the chart (a flag's window). */
export interface BandSpec {
  from: string;
  to: string;
  label: string;
}

export interface AxisSpec {
  label: string;
  domain: [number, number];
}

/** One row per fleet day: `day` plus one value per series key; null is a gap. */
export type DailyRow = { day: string } & Record<string, number | null | string>;

export interface DailyChartData {
  id: string;
  title: string;
  xLabel: string;
  left: AxisSpec;
  right?: AxisSpec;
  rows: DailyRow[];
  series: SeriesSpec[];
  refLines: ReferenceLineSpec[];
  bands: BandSpec[];
  /** Days in the range and days with at least one figure: the caption says how many are gaps. */
  days: number;
  daysWithData: number;
  /** One line under the chart: what the figure is, and that gaps are days without figures. */
  note: string;
}
