import type { FlagSettings } from './config';
import type { Judgement } from './judge';

/** The figures behind a flag, stored as flag.evidence (JSON, snake_case like the API). */
export function evidenceOf(j: Judgement, settings: FlagSettings, direction: string): Record<string, unknown> {
  const d = j.detection;
  const t = d.trend;
  const e = d.ewma;
  const c = d.cusum;
  return {
    // Which rule opened: 'mann_kendall+ewma' (both) or 'cusum+rank_sum' or 'cusum+mann_kendall' (the fast path); null when neither holds.
    opened_by: d.path,
    direction,
    // 'log': level, slope, EWMA, limits and min_change below are natural logs of the figure.
    scale: d.scale,
    days_with_data: d.n,
    level: d.level,
    min_change: d.minChange,
    // Weather adjustment (lib/flags/weather.ts): y − β1·(W² − mean W²), fitted on the baseline days.
    weather_adjustment: j.weather && {
      beta0: j.weather.beta0,
      beta1_per_w2: j.weather.beta1,
      mean_w2: j.weather.meanW2,
      // − β2·(B − mean B) too, with B the day's beam share of the wind; null when the wind alone was used.
      beta2_per_beam_share: j.weather.beta2,
      mean_beam_share: j.weather.meanBeam,
      baseline_days: j.weather.baselineDays,
    },
    // Days of the window with more wind than the baseline saw (lib/flags/weather.ts withinBaselineWeather) were left out.
    weather_range: j.weatherRange && { max_wind_ms: j.weatherRange.maxWindMs, days_left_out: j.weatherRange.leftOut },
    mann_kendall: t && {
      holds: t.holds,
      s: t.mk.s,
      var_s: t.mk.varS,
      z: t.mk.z,
      p_increasing: t.mk.pIncreasing,
      p_decreasing: t.mk.pDecreasing,
      p_two_sided: t.mk.pTwoSided,
      alpha: settings.mannKendall.alpha,
      sen_slope_per_day: t.sen.slope,
      sen_lower: t.sen.lower,
      sen_upper: t.sen.upper,
      sen_confidence: t.sen.confidence,
      change_over_window: t.change,
    },
    ewma: e && {
      holds: e.holds,
      lambda: settings.ewma.lambda,
      k: settings.ewma.k,
      target: e.target,
      sigma: e.sigma,
      baseline_days: e.baselineDays,
      ewma: e.ewma,
      z: e.z,
      limit: e.limit,
    },
    // The fast path (lib/flags/cusum.ts): one-sided tabular CUSUM; k, h, c in the series' unit (scale above).
    cusum: c && {
      holds: c.holds,
      target: c.target,
      sigma: c.sigma,
      k: c.k,
      h: c.h,
      c: c.c,
      run_days: c.run,
      shifted_mean: c.shiftedMean,
      level_now: c.now,
      level_now_winsorised: c.judgedNow,
      signal: c.signal,
      // The signal's confirmation: 'rank_sum' (the run's days against the baseline's and the window's before the run; the larger p)
      // or 'mann_kendall' (over the window, against a known healthy level).
      confirm_test: c.confirm?.test ?? null,
      confirm_p: c.confirm?.p ?? null,
      confirm_days: c.confirm?.days ?? null,
      confirm_days_before: c.confirm?.daysBefore ?? null,
      confirm_alpha: settings.cusum.confirmAlpha,
    },
  };
}
