/**
 * The fleet page's composite station-keeping health score, 0–100 (100: no
 * sign of trouble). The project's own rule of thumb for ranking vessels
 * against each other — common practice, no source — and shown on the page
 * with every weight and threshold, built from the constants below so the
 * text and the arithmetic cannot drift apart.
 *
 * Each component loses a share of its weight, linear between "no loss" and
 * "full loss". A component that cannot be computed (no DP time, no weather
 * fit yet, no registered thrusters) is left out and the others are rescaled
 * to 100; the score is then marked partial. Without accuracy and power
 * figures (no DP time in the window) there is no score: flags and service
 * dates alone say nothing about how the vessel keeps station.
 */

export const SCORE_WINDOW_DAYS = 30;

export type ComponentKey = 'accuracy' | 'power' | 'flags' | 'service';

export interface ScoreComponent {
  key: ComponentKey;
  label: string;
  weight: number;
  /** The figure the component reads, in words. */
  figure: string;
  /** Figure at or below which nothing is lost, and at or above which the whole weight is lost. */
  none: number;
  full: number;
  unit: string;
}

export const SCORE_COMPONENTS: readonly ScoreComponent[] = [
  {
    key: 'accuracy',
    label: 'Accuracy against the weather',
    weight: 40,
    figure: `median of the daily p95 ratio to the weather-expected p95 (p95_norm), last ${SCORE_WINDOW_DAYS} days`,
    none: 1,
    full: 1.5,
    unit: '× expected',
  },
  {
    key: 'power',
    label: 'Power-limit events',
    weight: 20,
    figure: `limit events per 24 DP hours over the last ${SCORE_WINDOW_DAYS} days`,
    none: 0,
    full: 4,
    unit: 'per DP day',
  },
  {
    key: 'flags',
    label: 'Open trend flags',
    weight: 25,
    figure: 'open and acknowledged flags, alarm 3 points, warning 2, advisory 1',
    none: 0,
    full: 6,
    unit: 'points',
  },
  {
    key: 'service',
    label: 'Thrusters due for service',
    weight: 15,
    figure: 'thrusters within 10 % of their service interval, or projected to reach it within 30 days',
    none: 0,
    full: 2,
    unit: 'thrusters',
  },
];

/** A thruster counts as due when this share of its interval or less is left… */
export const DUE_SHARE_LEFT = 0.1;
/** …or when the trailing wear rate reaches the interval within this many days. */
export const DUE_WITHIN_DAYS = 30;

export const FLAG_POINTS: Record<string, number> = { alarm: 3, warning: 2, advisory: 1 };

export interface ScoreInputs {
  /** Median p95_norm of the window's days that have one; null without any. */
  p95NormMedian: number | null;
  /** Σ dp_hours and Σ limit_events over the window's days with figures (null: no figure). */
  dpHours: number | null;
  limitEvents: number | null;
  /** Flags not closed, by severity. */
  openFlags: Readonly<Record<string, number>>;
  /** Registered thrusters, and how many of them are due (see DUE_*). */
  thrusters: number;
  thrustersDue: number;
}

export interface ComponentResult {
  key: ComponentKey;
  /** The figure read; null when it cannot be computed (component left out). */
  value: number | null;
  /** Points lost, 0..weight before rescaling; null when left out. */
  lost: number | null;
}

export interface HealthScore {
  /** 0–100, whole points; null when there is no DP time in the window. */
  score: number | null;
  partial: boolean;
  components: ComponentResult[];
}

const clamp01 = (x: number) => Math.min(1, Math.max(0, x));

/** Limit events per 24 DP hours; null without DP time (never 0 or infinity). */
export function limitRate(limitEvents: number | null, dpHours: number | null): number | null {
  if (dpHours === null || !(dpHours > 0) || limitEvents === null) return null;
  return (limitEvents * 24) / dpHours;
}

export function flagPoints(openFlags: Readonly<Record<string, number>>): number {
  return Object.entries(openFlags).reduce((sum, [severity, n]) => sum + (FLAG_POINTS[severity] ?? 1) * n, 0);
}

/**
 * A thruster is due when little of its interval is left or the trailing rate
 * gets there soon. `ratePerDay` null or 0: only the share left decides.
 */
export function isThrusterDue(toServiceH: number, serviceIntervalH: number, ratePerDay: number | null): boolean {
  if (toServiceH <= DUE_SHARE_LEFT * serviceIntervalH) return true;
  return ratePerDay !== null && ratePerDay > 0 && toServiceH / ratePerDay <= DUE_WITHIN_DAYS;
}

export function healthScore(input: ScoreInputs): HealthScore {
  const values: Record<ComponentKey, number | null> = {
    accuracy: input.p95NormMedian,
    power: limitRate(input.limitEvents, input.dpHours),
    flags: flagPoints(input.openFlags),
    service: input.thrusters > 0 ? input.thrustersDue : null,
  };
  const components = SCORE_COMPONENTS.map((c): ComponentResult => {
    const value = values[c.key];
    return { key: c.key, value, lost: value === null ? null : c.weight * clamp01((value - c.none) / (c.full - c.none)) };
  });
  const counted = components.filter((c) => c.lost !== null);
  const hasStationFigures = values.accuracy !== null || values.power !== null;
  if (!hasStationFigures) return { score: null, partial: true, components };
  const weightOf = (k: ComponentKey) => SCORE_COMPONENTS.find((c) => c.key === k)!.weight;
  const available = counted.reduce((s, c) => s + weightOf(c.key), 0);
  const lost = counted.reduce((s, c) => s + c.lost!, 0);
  return { score: Math.round(100 * (1 - lost / available)), partial: counted.length < components.length, components };
}

export type ScoreBand = 'steady' | 'watch' | 'attention' | 'none';

/** Words beside the number, so the band never depends on colour alone. */
export function scoreBand(score: number | null): ScoreBand {
  if (score === null) return 'none';
  if (score >= 80) return 'steady';
  if (score >= 60) return 'watch';
  return 'attention';
}

export const BAND_LABEL: Record<ScoreBand, string> = {
  steady: 'Steady',
  watch: 'Watch',
  attention: 'Needs a look',
  none: 'No DP data',
};
