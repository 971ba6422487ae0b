import { huberRegression } from '../metrics/normalisedAccuracy';
import { mean } from './stats';
import type { DayValue } from './window';

/**
 * Weather adjustment of a raw daily series before the trend tests, so that
 * a change of weather alone does not look like degradation (heading RMS,
 * thruster efficiency and power-limit events all move with the wind on a
 * healthy vessel; p95 is handled by the daily job's p95_norm instead).
 *
 * Method: regression adjustment (D. M. Hawkins, "Regression adjustment for
 * variables in multivariate quality control", J. Quality Technology 25
 * (1993) 170–182): fit the series on the weather over the baseline days
 * only, then judge each day's value with the weather's share removed,
 *   y_adj = y − β1·(W² − mean W² of the baseline days),
 * so adjusted values keep the baseline's level and unit. The model is the
 * one p95_norm uses, y = β0 + β1·W² with W the day's mean wind (drag grows
 * with the square of the speed), fitted by the same Huber IRLS
 * (lib/metrics/normalisedAccuracy.ts), so one stormy day cannot bend it.
 * The fit never sees the window, so a fault's trend stays in the adjusted
 * values. A day without a wind figure cannot be adjusted and is left out.
 */

export interface WeatherFit {
  beta0: number;
  beta1: number;
  meanW2: number;
  /** With the beam share B as a second regressor (heading RMS): y = β0 + β1·W² + β2·B; else null. */
  beta2: number | null;
  meanBeam: number | null;
  baselineDays: number;
}

/**
 * Fit over the baseline values that have a wind figure; null without at least `minDays` of them or a
 * solvable fit. With `beam` (a day's beam share of the wind, 0 bow or stern … 1 beam), over the days
 * that have both, the beam share is a second regressor — heading RMS follows the wind's angle off
 * the bow more than its speed (docs/flags.md "Weather"); when that fit cannot be made (too few days,
 * or a vessel that always heads into the wind, whose beam share does not vary) the wind alone is used.
 */
export function fitWeather(baseline: readonly DayValue[], wind: ReadonlyMap<string, number>, minDays: number, beam?: ReadonlyMap<string, number>): WeatherFit | null {
  if (beam) {
    const both = baseline.filter((d) => wind.has(d.day) && beam.has(d.day));
    if (both.length >= minDays) {
      const w2 = both.map((d) => wind.get(d.day)! ** 2);
      const b = both.map((d) => beam.get(d.day)!);
      const spread = Math.max(...b) - Math.min(...b);
      const fit = spread > 0.05 ? huberRegression(both.map((_, i) => [1, w2[i]!, b[i]!]), both.map((d) => d.value)) : null;
      if (fit && fit.coef.every(Number.isFinite)) {
        return { beta0: fit.coef[0]!, beta1: fit.coef[1]!, meanW2: mean(w2), beta2: fit.coef[2]!, meanBeam: mean(b), baselineDays: both.length };
      }
    }
  }
  const points = baseline.filter((d) => wind.has(d.day));
  if (points.length < minDays) return null;
  const w2 = points.map((d) => wind.get(d.day)! ** 2);
  const fit = huberRegression(w2.map((x) => [1, x]), points.map((d) => d.value));
  if (!fit) return null;
  return { beta0: fit.coef[0]!, beta1: fit.coef[1]!, meanW2: mean(w2), beta2: null, meanBeam: null, baselineDays: points.length };
}

/** Each day's value with the weather's share removed; days without the figures the fit uses are left out. */
export function adjustForWeather(values: readonly DayValue[], wind: ReadonlyMap<string, number>, fit: WeatherFit, beam?: ReadonlyMap<string, number>): DayValue[] {
  const byBeam = fit.beta2 !== null && beam !== undefined;
  return values
    .filter((d) => wind.has(d.day) && (!byBeam || beam.has(d.day)))
    .map((d) => ({
      day: d.day,
      value: d.value - fit.beta1 * (wind.get(d.day)! ** 2 - fit.meanW2) - (byBeam ? fit.beta2! * (beam.get(d.day)! - fit.meanBeam!) : 0),
    }));
}

/**
 * The window's days in weather the baseline has seen: a mean wind at most
 * the baseline's windiest day × (1 + margin). Beyond it the weather's share
 * is extrapolated from calmer days (by the fit above, or by p95_norm's own
 * normalisation), and a healthy vessel whose figure grows a little faster
 * than W² in a blow would look like one that is wearing. So such days are
 * left out, as gaps, until the baseline has seen such weather; this is the
 * reference-conditions filter of ship performance monitoring (ISO 19030-2
 * keeps only data taken in conditions its reference covers; from memory).
 * Days without a wind figure stay: they are not known to be outside. Null
 * when the baseline has fewer than `minDays` days with wind (no range known).
 */
export interface WeatherRange {
  maxWindMs: number;
  leftOut: number;
}

export function withinBaselineWeather(
  window: readonly DayValue[],
  baseline: readonly DayValue[],
  wind: ReadonlyMap<string, number>,
  margin: number,
  minDays: number,
): { window: DayValue[]; range: WeatherRange } | null {
  const seen = baseline.filter((d) => wind.has(d.day)).map((d) => wind.get(d.day)!);
  if (seen.length < minDays) return null;
  const maxWindMs = Math.max(...seen) * (1 + margin);
  const kept = window.filter((d) => !(wind.get(d.day)! > maxWindMs));
  return { window: kept, range: { maxWindMs, leftOut: window.length - kept.length } };
}
