import { UNIT, type Unit } from '../charts/units';

/**
 * What each watched metric (metrics-v1 "Trend flags") means, for people:
 * its name, unit, which direction is worse, and one sentence of definition.
 * The names are the metrics-v1 names the flag job writes into flag.metric
 * (seed/scenarios/groundTruth.ts lists the same). A metric not listed here is
 * still shown, by its raw name, without a chart.
 */
export interface MetricInfo {
  label: string;
  quantity: string;
  unit: Unit;
  worse: 'rising' | 'falling';
  definition: string;
}

export const FLAG_METRICS: Record<string, MetricInfo> = {
  p95_norm: {
    label: 'p95 against the weather',
    quantity: 'p95 ratio',
    unit: UNIT.ratio,
    worse: 'rising',
    definition: "Daily p95 radial error divided by what the vessel's own weather fit expects; above 1 is worse than the weather explains.",
  },
  hdg_rms: {
    label: 'Heading error RMS',
    quantity: 'Heading error RMS',
    unit: UNIT.degree,
    worse: 'rising',
    definition: 'Root mean square of heading minus heading set point over the DP intervals of the day.',
  },
  efficiency_index: {
    label: 'Thruster efficiency index',
    quantity: 'Thrust per power^⅔',
    unit: UNIT.efficiency,
    worse: 'falling',
    definition: 'Thrust divided by power to the 2/3 while running; steady for a healthy unit, falling with fouling or damage.',
  },
  limit_events_per_dp_day: {
    label: 'Power-limit events per DP day',
    quantity: 'Limit events',
    unit: UNIT.perDpDay,
    worse: 'rising',
    definition: 'Times the power limit cut in, scaled to 24 hours of DP time.',
  },
  sd_m_median: {
    label: 'Reference system noise',
    quantity: 'Median residual SD',
    unit: UNIT.metre,
    worse: 'rising',
    definition: "Median of the reference system's standard deviation against the filtered position.",
  },
  rejections: {
    label: 'Reference system rejections',
    quantity: 'Rejections',
    unit: UNIT.count,
    worse: 'rising',
    definition: "Times the DP system's tests rejected the reference system in the day.",
  },
};

export function metricInfo(metric: string): MetricInfo | null {
  return Object.hasOwn(FLAG_METRICS, metric) ? FLAG_METRICS[metric]! : null;
}

export interface Subject {
  kind: 'vessel' | 'thruster' | 'ref';
  /** The thruster or reference system id; null for the vessel itself. */
  unit: string | null;
}

/** `vessel`, `thruster:ID` or `ref:ID` (api-v1); anything else is read as the vessel. */
export function parseSubject(subject: string): Subject {
  const m = /^(thruster|ref):(.+)$/.exec(subject);
  if (m) return { kind: m[1] as 'thruster' | 'ref', unit: m[2]! };
  return { kind: 'vessel', unit: null };
}

export function subjectLabel(subject: string): string {
  const s = parseSubject(subject);
  if (s.kind === 'thruster') return `Thruster ${s.unit}`;
  if (s.kind === 'ref') return `Reference ${s.unit}`;
  return 'Vessel';
}

export const SEVERITIES = ['alarm', 'warning', 'advisory'] as const;
export type Severity = (typeof SEVERITIES)[number];

/** Larger is more severe; an unknown severity sorts last. */
export function severityRank(severity: string): number {
  const i = (SEVERITIES as readonly string[]).indexOf(severity);
  return i < 0 ? 0 : SEVERITIES.length - i;
}
