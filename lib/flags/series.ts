/**
 * The daily series the flag job watches (metrics-v1 "Trend flags": at
 * least these), and which way each one moves when something degrades.
 * The key is what a flag stores as its `metric`, and the name the
 * simulator's ground truth uses (seed/scenarios/groundTruth.ts).
 */

export const SERIES_KEYS = ['p95_norm', 'hdg_rms', 'efficiency_index', 'limit_events_per_dp_day', 'sd_m_median', 'rejections'] as const;
export type SeriesKey = (typeof SERIES_KEYS)[number];

export type SubjectKind = 'vessel' | 'thruster' | 'ref';
export type Direction = 'rising' | 'falling';

export interface WatchedSeries {
  key: SeriesKey;
  subject: SubjectKind;
  /** Which way is worse. */
  direction: Direction;
  /** For explanations: "heading RMS", "efficiency". */
  label: string;
  /** Unit in explanations; '' for a ratio. */
  unit: string;
  /**
   * Default of the series' `weatherAdjust` setting: judged with the weather's share
   * removed (lib/flags/weather.ts), because the raw figure moves with the wind on a
   * healthy vessel. p95_norm needs none: the daily job already divides out the weather.
   */
  weatherAdjust: boolean;
  /**
   * Whether the figure moves with the wind on a healthy vessel (before any adjustment): the default of the
   * series' `baselineWeatherOnly` setting. p95_norm does, in what its normalisation leaves over.
   */
  windDependent: boolean;
  /** Default of the series' `logScale` setting: judged as a logarithm (judge.ts); for positive scale figures, not counts. */
  logScale: boolean;
  /** The figure's level on a healthy unit by construction, if it has one (p95_norm: 1); the EWMA target while the series has no baseline of its own. */
  healthyLevel: number | null;
}

export const WATCHED_SERIES: Record<SeriesKey, WatchedSeries> = {
  p95_norm: { key: 'p95_norm', subject: 'vessel', direction: 'rising', label: 'weather-normalised position error p95', unit: '×', weatherAdjust: false, windDependent: true, logScale: true, healthyLevel: 1 },
  hdg_rms: { key: 'hdg_rms', subject: 'vessel', direction: 'rising', label: 'heading RMS', unit: '°', weatherAdjust: true, windDependent: true, logScale: true, healthyLevel: null },
  efficiency_index: { key: 'efficiency_index', subject: 'thruster', direction: 'falling', label: 'efficiency', unit: 'kN/kW^(2/3)', weatherAdjust: true, windDependent: true, logScale: true, healthyLevel: null },
  limit_events_per_dp_day: { key: 'limit_events_per_dp_day', subject: 'vessel', direction: 'rising', label: 'power-limit events per DP day', unit: '/DP day', weatherAdjust: true, windDependent: true, logScale: false, healthyLevel: null },
  sd_m_median: { key: 'sd_m_median', subject: 'ref', direction: 'rising', label: 'noise (median sd)', unit: 'm', weatherAdjust: false, windDependent: false, logScale: true, healthyLevel: null },
  rejections: { key: 'rejections', subject: 'ref', direction: 'rising', label: 'rejections', unit: '/day', weatherAdjust: false, windDependent: false, logScale: false, healthyLevel: null },
};
