import type { FlagSettings, SeriesSettings } from './config';
import { detect, type Detection } from './detect';
import { firstDayAfterClose } from './lifecycle';
import type { WatchedSeries } from './series';
import { mean, sampleSd } from './stats';
import { adjustForWeather, fitWeather, withinBaselineWeather, type WeatherFit, type WeatherRange } from './weather';
import { rangesFor, within, type DayValue } from './window';

/**
 * One series on one day, from its stored values to a detection: the window
 * and baseline of the day (window.ts), clipped to the days after the
 * series' last closed flag (lifecycle.ts), weather-adjusted when the series
 * asks for it (weather.ts), then the two methods (detect.ts). Pure.
 *
 * A weather-adjusted series is judged only once its baseline holds
 * minBaselineDays days with wind: without a fit there is no telling weather
 * from wear. A series that moves with the wind is judged on the window's
 * days whose wind the baseline has seen (weather.ts, withinBaselineWeather).
 * Other series are judged from minDays in the window (Mann–Kendall alone
 * until the baseline exists for the EWMA chart).
 */

export interface Judgement {
  detection: Detection;
  weather: WeatherFit | null;
  /** The wind the window's days were held to, and how many were left out; null when the rule did not apply. */
  weatherRange: WeatherRange | null;
}

export function judge(
  values: readonly DayValue[],
  wind: ReadonlyMap<string, number>,
  watched: WatchedSeries,
  series: SeriesSettings,
  settings: FlagSettings,
  day: string,
  closedDay: string | null,
  beam?: ReadonlyMap<string, number>,
): Judgement | null {
  const r = rangesFor(day, settings);
  const windowFrom = firstDayAfterClose(r.window.from, closedDay);
  let window = within(values, windowFrom, day);
  let baseline = within(values, firstDayAfterClose(r.baseline.from, closedDay), r.baseline.to);
  // Scale figures (RMS, sd, p95, efficiency) are judged as logarithms when all are positive.
  const scale = series.logScale && window.every((d) => d.value > 0) && baseline.every((d) => d.value > 0) ? 'log' : 'linear';
  if (scale === 'log') {
    window = window.map((d) => ({ day: d.day, value: Math.log(d.value) }));
    baseline = baseline.map((d) => ({ day: d.day, value: Math.log(d.value) }));
  }
  // A unit whose figure scatters too much in its baseline, before any weather adjustment (idling,
  // many operating points), is not judged: config maxBaselineScatter.
  const limit = series.maxBaselineScatter;
  if (limit !== null && baseline.length >= settings.minBaselineDays && scatter(baseline.map((d) => d.value), scale) > limit) return null;
  let weather: WeatherFit | null = null;
  if (series.weatherAdjust) {
    const byBeam = series.weatherBeam ? beam : undefined;
    weather = fitWeather(baseline, wind, settings.minBaselineDays, byBeam);
    if (!weather) return null;
    window = adjustForWeather(window, wind, weather, byBeam);
    baseline = adjustForWeather(baseline, wind, weather, byBeam);
  }
  let weatherRange: WeatherRange | null = null;
  if (series.baselineWeatherOnly) {
    const comparable = withinBaselineWeather(window, baseline, wind, settings.weatherRangeMargin, settings.minBaselineDays);
    if (comparable) ({ window, range: weatherRange } = comparable);
  }
  const healthy = watched.healthyLevel === null ? null : scale === 'log' ? Math.log(watched.healthyLevel) : watched.healthyLevel;
  const detection = detect(window, baseline, watched.direction, series, settings, { from: windowFrom, to: day }, scale, healthy);
  return detection && { detection, weather, weatherRange };
}

/** Day-to-day scatter of baseline values: the sd of their logs (≈ coefficient of variation), or sd / |mean| on the linear scale. */
function scatter(values: readonly number[], scale: 'log' | 'linear'): number {
  const m = mean(values);
  const sd = sampleSd(values);
  return scale === 'log' ? sd : Math.abs(m) > 0 ? sd / Math.abs(m) : Infinity;
}
