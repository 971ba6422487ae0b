import { z } from 'zod';
import { SERIES_KEYS, WATCHED_SERIES, type SeriesKey } from './series';

/**
 * The flag job's settings: windows, method parameters and thresholds, with
 * their defaults. Stored as a JSON object in the `flag_settings` row
 * (`holdfast flags settings FILE`), so every job process evaluates with the
 * same numbers; anything the object leaves out takes the default below.
 * docs/flags.md explains each one.
 */

const days = (fallback: number, max = 365) => z.number().int().min(1).max(max).default(fallback);

/** How a series is judged; every field optional here, filled from SERIES_DEFAULTS and then GENERIC. */
const seriesSchema = z
  .object({
    enabled: z.boolean(),
    /** Least relative change over the window (Sen's slope × window, against the baseline level), e.g. 0.1 = 10 %. */
    minRelativeChange: z.number().min(0).max(10),
    /** Least absolute change, in the metric's own unit (for counts whose level can be 0). */
    minAbsoluteChange: z.number().min(0),
    /** Judge the series with the weather's share removed (lib/flags/weather.ts). */
    weatherAdjust: z.boolean(),
    /** Judge the series as its logarithm (lib/flags/judge.ts); for positive scale figures. */
    logScale: z.boolean(),
    /**
     * Leave a series unjudged while its baseline, before any weather adjustment, scatters more than this (sd of the logs, ≈ the
     * coefficient of variation; sd/mean on the linear scale). null: no limit.
     */
    maxBaselineScatter: z.number().positive().nullable(),
    /**
     * Judge only the window's days whose mean wind the baseline has seen (at most its windiest day × (1 + weatherRangeMargin)):
     * beyond that, the weather's effect is extrapolated, not measured (lib/flags/weather.ts).
     */
    baselineWeatherOnly: z.boolean(),
    /** With weatherAdjust: take the wind's beam share (daily_vessel.wind_beam_share) into the weather fit too (lib/flags/weather.ts). */
    weatherBeam: z.boolean(),
  })
  .partial()
  .strict();
export type SeriesSettings = Required<z.infer<typeof seriesSchema>>;

const GENERIC: Omit<SeriesSettings, 'weatherAdjust' | 'logScale' | 'baselineWeatherOnly'> = {
  enabled: true,
  minRelativeChange: 0.1,
  minAbsoluteChange: 0,
  maxBaselineScatter: null,
  weatherBeam: false,
};

/**
 * Defaults per watched series. The thresholds are the project's choice,
 * set on simulated fleets (docs/flags.md "How the defaults were chosen"):
 * large enough that day-to-day scatter does not open flags, small enough
 * to catch the seeded faults within about a week of showing.
 */
export const SERIES_DEFAULTS: Record<SeriesKey, Partial<SeriesSettings>> = {
  p95_norm: { minRelativeChange: 0.15 },
  // Heading RMS follows the wind's angle off the bow more than its speed (docs/flags.md, evaluation).
  hdg_rms: { minRelativeChange: 0.15, weatherBeam: true },
  // A thruster that idles or works at many operating points (tunnel, main propeller on DP)
  // has an index that scatters by tens of % a day: the bollard relation behind it does not hold.
  efficiency_index: { minRelativeChange: 0.05, maxBaselineScatter: 0.1 },
  limit_events_per_dp_day: { minRelativeChange: 0.5, minAbsoluteChange: 2 },
  sd_m_median: { minRelativeChange: 0.25 },
  rejections: { minRelativeChange: 0.5, minAbsoluteChange: 20 },
};

const seriesMap = z
  .object(Object.fromEntries(SERIES_KEYS.map((k) => [k, seriesSchema.optional()])) as Record<SeriesKey, z.ZodOptional<typeof seriesSchema>>)
  .strict()
  .default({})
  // What a stored object leaves out keeps the series' default, then the generic one.
  .transform(
    (m) =>
      Object.fromEntries(
        SERIES_KEYS.map((k) => [k, {
          ...GENERIC,
          weatherAdjust: WATCHED_SERIES[k].weatherAdjust,
          logScale: WATCHED_SERIES[k].logScale,
          baselineWeatherOnly: WATCHED_SERIES[k].windDependent,
          ...SERIES_DEFAULTS[k],
          ...m[k],
        }]),
      ) as Record<SeriesKey, SeriesSettings>,
  );

export const flagSettingsSchema = z
  .object({
    /** Trailing window of the trend test: the evaluated day and the days before it. */
    windowDays: days(30),
    /** Days with data the window must hold (Gilbert 1987 §16.4.1: the normal approximation from n ≥ 10). */
    minDays: days(10),
    /** Baseline of the EWMA chart: this many days just before the window. */
    baselineDays: days(30),
    minBaselineDays: days(10),
    mannKendall: z
      .object({
        /** One-sided significance level in the direction of degradation. */
        alpha: z.number().gt(0).lt(0.5).default(0.001),
        /** Confidence level of Sen's slope interval shown with the flag. */
        senConfidence: z.number().gt(0).lt(1).default(0.95),
      })
      .strict()
      .prefault({}),
    ewma: z
      .object({
        lambda: z.number().gt(0).max(1).default(0.2),
        /** Limit width, in standard deviations of the EWMA. */
        k: z.number().gt(0).max(10).default(3),
      })
      .strict()
      .prefault({}),
    cusum: z
      .object({
        /** Run the fast path (lib/flags/cusum.ts) beside Mann–Kendall + EWMA. */
        enabled: z.boolean().default(true),
        /** Reference value K, in baseline standard deviations. */
        k: z.number().min(0).max(5).default(0.5),
        /** Decision interval H, in baseline standard deviations. */
        h: z.number().gt(0).max(50).default(8),
        /** One-sided Mann–Kendall level the CUSUM's signal must be confirmed at. */
        confirmAlpha: z.number().gt(0).lt(0.5).default(0.001),
        /** Baseline days the fast path needs (its s must be well estimated). */
        minBaselineDays: days(20),
      })
      .strict()
      .prefault({}),
    /** How far above the baseline's windiest day a window day's mean wind may be and still be judged (series with baselineWeatherOnly). */
    weatherRangeMargin: z.number().min(0).max(10).default(0.1),
    /** An open flag whose condition has not held for this many evaluated days proposes closing. */
    closeAfterClearDays: days(7),
    series: seriesMap,
  })
  .strict();

export type FlagSettings = z.infer<typeof flagSettingsSchema>;

export const DEFAULT_FLAG_SETTINGS: FlagSettings = flagSettingsSchema.parse({});

/** Thrown for a settings object that does not fit the schema; the message lists every fault by path. */
export class FlagSettingsError extends Error {}

export function parseFlagSettings(value: unknown): FlagSettings {
  const result = flagSettingsSchema.safeParse(value ?? {});
  if (result.success) {
    if (result.data.minDays > result.data.windowDays) throw new FlagSettingsError('minDays: must not exceed windowDays');
    if (result.data.minBaselineDays > result.data.baselineDays) throw new FlagSettingsError('minBaselineDays: must not exceed baselineDays');
    return result.data;
  }
  throw new FlagSettingsError(result.error.issues.map((i) => `${i.path.join('.') || '(settings)'}: ${i.message}`).join('; '));
}
