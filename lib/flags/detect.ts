import type { FlagSettings, SeriesSettings } from './config';
import { cusumChart, shiftedMean } from './cusum';
import { ewmaChart, ewmaHalfWidth } from './ewma';
import { mannKendall, type MannKendallResult } from './mannKendall';
import { median } from '../metrics/refs';
import { rankSum } from './rankSum';
import { mean, sampleSd } from './stats';
import { senSlope, type SenSlope } from './senSlope';
import type { Direction } from './series';
import { dayNumber, type DayValue } from './window';

/**
 * Does one daily series show degradation on one day? Pure: the caller hands
 * the values of the trailing window and of the baseline before it (on the
 * scale judge.ts chose).
 *
 * Each method finds degradation on its own terms (thresholds in config.ts,
 * docs/flags.md):
 * - Mann–Kendall over the window: one-sided p < α in the direction of
 *   degradation, and the change Sen's slope implies over the window
 *   (slope × days spanned) at least the series' minimum change;
 * - EWMA chart of the window's days against the baseline (target = baseline
 *   mean, s = baseline standard deviation, as in NIST/SEMATECH §6.3.2.4):
 *   the EWMA of the evaluated day more than L standard deviations beyond the
 *   target on the degrading side, and at least the minimum change from it.
 * A flag opens when both find it (project's rule): with some 150 series
 * judged every day, either method alone at its usual settings (α = 0.001,
 * L = 3) raises several false alarms a season on a healthy fleet, while
 * requiring both kept every simulated healthy series quiet (docs/flags.md
 * "Evaluation"). Both together are slow, though: Kendall's test over 30 days
 * needs a fault to dominate a good part of the window. So a flag also opens
 * on a faster first signal, the one-sided CUSUM (cusum.ts) confirmed by
 * Kendall's test and measured against the minimum change (below). An open
 * flag's condition holds while any of the three still finds it.
 * The minimum change keeps statistically clear but practically small drifts
 * (a 2 % rise on a series with almost no scatter) from opening flags.
 */

export interface TrendEvidence {
  mk: MannKendallResult;
  sen: SenSlope;
  /** Change over the window implied by Sen's slope (slope × days spanned), signed. */
  change: number;
  holds: boolean;
}

export interface EwmaEvidence {
  target: number;
  sigma: number;
  baselineDays: number;
  ewma: number;
  /** (EWMA − target) / its standard deviation at that point. */
  z: number;
  limit: number;
  holds: boolean;
}

export interface CusumEvidence {
  target: number;
  sigma: number;
  /** Reference value K = max(cusum.k·s, minimum change / 2) and decision interval H = cusum.h·s, in the series' unit. */
  k: number;
  h: number;
  /** The one-sided sum on the evaluated day, and for how many days in a row it has been above 0. */
  c: number;
  run: number;
  /** The mean since the run began, μ0 ± (K + C/N); null while C = 0. */
  shiftedMean: number | null;
  /** Sen's line through the run's days, read on the evaluated day: where the figure stands now; null while C = 0. */
  now: number | null;
  /** The same line through the days as the chart took them (winsorised, see detect): what the minimum change is judged on. */
  judgedNow: number | null;
  /** C > H. */
  signal: boolean;
  /**
   * The confirmation the fast path asks for, one-sided in the degrading direction: the rank-sum tests of
   * the run's `days` against the baseline's and against the window's `daysBefore` days before the run
   * (the larger p), or, charted against a known healthy level without a baseline, Kendall's test over
   * the window. Null while there is no signal.
   */
  confirm: { test: 'rank_sum' | 'mann_kendall'; p: number; days: number; daysBefore: number } | null;
  /** Signal, confirmed at confirmAlpha, and `now` at least the minimum change from the target. */
  holds: boolean;
}

export type Scale = 'log' | 'linear';
export type DetectionPath = 'mann_kendall+ewma' | 'cusum+rank_sum' | 'cusum+mann_kendall';

/** Whether a detection opened by the fast path (a CUSUM signal and its confirmation). */
export function isFastPath(path: DetectionPath | null): path is 'cusum+rank_sum' | 'cusum+mann_kendall' {
  return path === 'cusum+rank_sum' || path === 'cusum+mann_kendall';
}

export interface Detection {
  /**
   * 'log': every value (window, baseline, level, slope, EWMA, minimum change) is in natural-log
   * units of the figure (judge.ts chose it); 'linear': in the figure's own unit.
   */
  scale: Scale;
  /** Days with data in the window. */
  n: number;
  windowFrom: string;
  windowTo: string;
  /** Level the change is measured against: the baseline mean, else the window median. */
  level: number;
  /** Smallest change that counts, in the series' unit (from the relative and absolute minimums). */
  minChange: number;
  trend: TrendEvidence | null;
  ewma: EwmaEvidence | null;
  cusum: CusumEvidence | null;
  /** Which rule opens: both slow methods, or the CUSUM confirmed (by the rank-sum or Kendall's test); null when neither. */
  path: DetectionPath | null;
  /** Either rule finds degradation: a flag opens. */
  holds: boolean;
  /** At least one does: an open flag's condition still holds (it does not count as clear). */
  either: boolean;
}

/** σ estimated from successive differences: mean |x_t − x_{t−1}| / d2, d2 = 1.128 for ranges of two. */
export function movingRangeSigma(xs: readonly number[]): number {
  let sum = 0;
  for (let i = 1; i < xs.length; i++) sum += Math.abs(xs[i]! - xs[i - 1]!);
  return sum / (xs.length - 1) / 1.128;
}

/**
 * Sen's line through (t, x) read at the last t: slope = Sen's median pairwise slope, intercept
 * = median of x − slope·t (Sen 1968; Conover's intercept, as in Helsel and Hirsch, Statistical
 * Methods in Water Resources, 2002, §10.1.2 — from memory).
 */
export function lineEnd(t: readonly number[], x: readonly number[]): number {
  const slope = senSlope(t, x, 0, 0.95)!.slope;
  return median(x.map((y, i) => y - slope * t[i]!))! + slope * t.at(-1)!;
}

/**
 * The smallest change that counts. On the log scale a relative change r is
 * ln(1 + r) upwards and −ln(1 − r) downwards, so "10 %" means the same
 * thing as on the figure itself; the absolute minimum applies to linear
 * series (counts) only.
 */
export function minimumChange(series: Pick<SeriesSettings, 'minRelativeChange' | 'minAbsoluteChange'>, level: number, sign: number, scale: Scale): number {
  if (scale === 'log') return sign > 0 ? Math.log1p(series.minRelativeChange) : -Math.log1p(-Math.min(series.minRelativeChange, 0.99));
  return Math.max(series.minRelativeChange * Math.abs(level), series.minAbsoluteChange);
}

/**
 * `window` and `baseline` sorted by day, finite values only. Null when the
 * window holds fewer than settings.minDays days (no judgement possible).
 */
export function detect(
  window: readonly DayValue[],
  baseline: readonly DayValue[],
  direction: Direction,
  series: SeriesSettings,
  settings: FlagSettings,
  range: { from: string; to: string },
  scale: Scale = 'linear',
  healthyLevel: number | null = null,
): Detection | null {
  if (window.length < settings.minDays) return null;
  const sign = direction === 'rising' ? 1 : -1;
  const values = window.map((d) => d.value);
  const hasBaseline = baseline.length >= settings.minBaselineDays;
  const base = baseline.map((d) => d.value);
  const level = hasBaseline ? mean(base) : (healthyLevel ?? median(values)!);
  const minChange = minimumChange(series, level, sign, scale);

  let trend: TrendEvidence | null = null;
  const mk = mannKendall(values);
  if (mk) {
    const t = window.map((d) => dayNumber(d.day));
    const sen = senSlope(t, values, mk.varS, settings.mannKendall.senConfidence)!;
    const change = sen.slope * (t[t.length - 1]! - t[0]!);
    const p = sign > 0 ? mk.pIncreasing : mk.pDecreasing;
    trend = { mk, sen, change, holds: p < settings.mannKendall.alpha && sign * change >= minChange && minChange > 0 };
  }

  let ewma: EwmaEvidence | null = null;
  let cusum: CusumEvidence | null = null;
  // Without its own baseline, a series with a known healthy level (p95_norm: 1 by construction)
  // is charted against that level, with s from the window's moving ranges, MR̄/1.128 (the
  // individuals chart's estimate, NIST/SEMATECH e-Handbook §6.3.2.2), which a slow drift hardly
  // inflates.
  const known = !hasBaseline && healthyLevel !== null && values.length >= 2;
  if (hasBaseline || known) {
    // A baseline without scatter (all days 0 limit events) gets a spread of a tenth of the
    // minimum change, so the chart keeps finite limits; the minimum change then decides.
    const sigma = Math.max(hasBaseline ? sampleSd(base) : movingRangeSigma(values), minChange / 10);
    const { lambda, k } = settings.ewma;
    // Each day enters the chart winsorised to target ± max(3·s, 2·minimum change): one outlying
    // day (a burst of limit events) moves the EWMA by at most λ times that and cannot open a
    // flag alone, while a shift that lasts still does (project's rule, no source).
    const clip = Math.max(3 * sigma, 2 * minChange);
    const clipped = values.map((v) => Math.min(level + clip, Math.max(level - clip, v)));
    const last = ewmaChart(clipped, { lambda, k, target: level, sigma }).at(-1)!;
    // The target is itself estimated from the baseline's n days, independently of the window, so
    // EWMA − target has variance s²·[λ/(2−λ)·(1 − (1−λ)^(2t)) + 1/n] (variance of a difference of
    // independent estimates). Without the 1/n term a short baseline would raise false alarms.
    const chartSd = ewmaHalfWidth({ lambda, k: 1, sigma }, values.length);
    const sd = Math.sqrt(chartSd ** 2 + (hasBaseline ? sigma ** 2 / base.length : 0));
    const limit = level + sign * k * sd;
    const z = (last.ewma - level) / sd;
    ewma = { target: level, sigma, baselineDays: base.length, ewma: last.ewma, z, limit, holds: sign * z > k && sign * (last.ewma - level) >= minChange && minChange > 0 };

    // The fast path: a one-sided CUSUM (Page 1954) of the same clipped days against the same
    // target and s. Its reference value is half the shift worth finding, K = max(k·s, minimum
    // change / 2) (the usual design: K is half the shift the chart is meant to find; Montgomery,
    // Introduction to Statistical Quality Control, §9.1 — from memory), so a drift smaller than the
    // minimum change hardly accumulates. A signal opens a flag when it is confirmed at confirmAlpha,
    // and the figure has moved at least the minimum change by now: Sen's line through the CUSUM's
    // run (the days since it last stood at 0, at least 3), read on the evaluated day (the mean of the
    // run would lag half the run behind a fault that grows). The confirmation asks whether the run's
    // days rank above (below) both the baseline's days and the window's days before the run, by the
    // Wilcoxon–Mann–Whitney test (rankSum.ts): by ranks, so one extreme day weighs no more than any
    // other, and a shift that is plain from its first days is confirmed within days, where Kendall's
    // test over a 30-day window needs the fault to fill a good part of the window first. Only with a
    // baseline of cusum.minBaselineDays, whose mean and s are good enough for a sum that
    // accumulates every error in the target. Against a healthy level known by construction
    // (p95_norm: 1) without a baseline there is nothing to rank against: Kendall's test over the
    // window confirms.
    const c = settings.cusum;
    if (c.enabled && ((hasBaseline && base.length >= c.minBaselineDays) || known)) {
      const side = sign > 0 ? 'upper' : 'lower';
      const o = { side, target: level, k: Math.max(c.k * sigma, minChange / 2), h: c.h * sigma } as const;
      const point = cusumChart(clipped, o).at(-1)!;
      const moved = shiftedMean(point, o);
      const runDays = Math.max(point.n, 3);
      // Judged on the winsorised days (one wild day cannot make the change); shown, and sized, on the days as they were.
      const runT = window.slice(-runDays).map((d) => dayNumber(d.day));
      const now = point.n > 0 ? lineEnd(runT, values.slice(-runDays)) : null;
      const judgedNow = point.n > 0 ? lineEnd(runT, clipped.slice(-runDays)) : null;
      const big = judgedNow !== null && sign * (judgedNow - level) >= minChange && minChange > 0;
      const confirm = point.signal ? confirmShift(values, runDays, hasBaseline ? base : null, trend, sign) : null;
      const confirmed = confirm !== null && confirm.p < c.confirmAlpha;
      cusum = { target: level, sigma, k: o.k, h: o.h, c: point.c, run: point.n, shiftedMean: moved, now, judgedNow, signal: point.signal, confirm, holds: point.signal && confirmed && big };
    }
  }

  return {
    scale,
    n: window.length,
    windowFrom: range.from,
    windowTo: range.to,
    level,
    minChange,
    trend,
    ewma,
    cusum,
    path: trend?.holds && ewma?.holds ? 'mann_kendall+ewma' : cusum?.holds ? (`cusum+${cusum.confirm!.test}` as const) : null,
    holds: Boolean((trend?.holds && ewma?.holds) || cusum?.holds),
    either: Boolean(trend?.holds || ewma?.holds || cusum?.holds),
  };
}

/**
 * The one-sided p that confirms a CUSUM signal (see detect). With a baseline: the run's days must
 * rank beyond both the baseline's days and the window's days before the run (the larger p of the
 * two rank-sum tests): a fault that began during the run sets its days apart from both, while a
 * level that merely differs a little from the baseline's all through the window (chance, with 150
 * series a day, or a weather fit a little off) builds a run as long as the window, which the few
 * days before it cannot confirm. Without a baseline: Kendall's test over the window.
 */
function confirmShift(values: readonly number[], runDays: number, baseline: readonly number[] | null, trend: TrendEvidence | null, sign: number): CusumEvidence['confirm'] {
  if (baseline) {
    const run = values.slice(-runDays);
    const before = values.slice(0, values.length - runDays);
    const a = rankSum(run, baseline);
    const b = rankSum(run, before);
    if (!a || !b) return null;
    const p = Math.max(sign > 0 ? a.pGreater : a.pLess, sign > 0 ? b.pGreater : b.pLess);
    return { test: 'rank_sum', p, days: run.length, daysBefore: before.length };
  }
  return trend && { test: 'mann_kendall', p: sign > 0 ? trend.mk.pIncreasing : trend.mk.pDecreasing, days: trend.mk.n, daysBefore: 0 };
}
