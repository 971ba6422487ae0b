import { addDays } from '../time/fleetDay';
import { median } from './refs';

/**
 * Environment-normalised accuracy, p95_norm.
 * Source: docs spec metrics-v1 "Station-keeping accuracy": the project fits,
 * per vessel, how p95 grows with wind (and current where sent) over a
 * baseline window, and reports each day's p95 as a ratio to what that fit
 * expects for that day's weather. The method and window below are the
 * project's choice (the spec leaves them open).
 *
 * Model. p95 = β0 + β1·W² (+ β2·U²), W the day's mean wind (m/s), U its mean
 * current (m/s). Wind and current drag forces grow with the square of the
 * speed (F = ½ρ·C_D·A·V², standard drag relation), and a DP system's
 * position error grows roughly in proportion to the force it must counter;
 * β0 is the calm-weather floor (reference system noise, control deadband).
 *
 * Method. Huber M-estimation by iteratively reweighted least squares
 * (P. J. Huber, "Robust estimation of a location parameter", Ann. Math.
 * Statist. 35 (1964) 73–101; IRLS as in P. W. Holland and R. E. Welsch,
 * "Robust regression using iteratively reweighted least-squares", Commun.
 * Statist. A6 (1977) 813–827). Tuning constant k = 1.345 (the usual value,
 * ~95 % efficiency at normal errors). Residual scale each iteration: the
 * normalised median absolute deviation, MAD/0.6745. Start from ordinary
 * least squares; weights w_i = min(1, k·s/|r_i|); stop when the
 * coefficients change by < 1e-10 relative, or after 100 iterations.
 * Huber downweights outlying p95 days (a bad reference system, a mode
 * change) so they cannot bend the baseline; it does not guard against
 * outlying weather values (leverage), which are measured, not estimated.
 *
 * Baseline window (default): the 90 days ending 30 days before the day
 * evaluated, [day − 119, day − 30], so the last 30 days (the trend flag's
 * window) never normalise themselves. At least 20 baseline days with p95 and
 * wind are needed, else null. A wind+current model is fitted from the
 * baseline days that carry current when at least 20 do; a day with current
 * uses it, a day without uses the wind-only model. Days whose p95 was in the
 * overflow bin (≥ 10 m, censored) should be left out of the baseline by the
 * caller. Expected p95 ≤ 0 (an extrapolation below a negative intercept) →
 * null.
 */

export const HUBER_K = 1.345;
export const MAD_TO_SIGMA = 0.6745;
export const MIN_BASELINE_DAYS = 20;
export const BASELINE_DAYS = 90;
export const BASELINE_LAG_DAYS = 30;

/** The default baseline window for `day` (inclusive YYYY-MM-DD bounds). */
export function baselineWindow(day: string): { from: string; to: string } {
  return { from: addDays(day, -(BASELINE_LAG_DAYS + BASELINE_DAYS - 1)), to: addDays(day, -BASELINE_LAG_DAYS) };
}

export interface WeatherDay {
  p95: number;
  wind_ms: number | null;
  current_ms?: number | null;
}

export interface RobustFit {
  coef: number[];
  /** Final residual scale s (MAD/0.6745). */
  scale: number;
  weights: number[];
  iterations: number;
}

/** Solves the small symmetric system A·x = b by Gaussian elimination with partial pivoting; null when singular. */
function solve(a: number[][], b: number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i]!]);
  const scale = Math.max(...a.map((row, i) => Math.abs(row[i]!)), 1e-300);
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) if (Math.abs(m[r]![c]!) > Math.abs(m[p]![c]!)) p = r;
    if (Math.abs(m[p]![c]!) <= 1e-12 * scale) return null;
    [m[c], m[p]] = [m[p]!, m[c]!];
    for (let r = c + 1; r < n; r++) {
      const f = m[r]![c]! / m[c]![c]!;
      for (let j = c; j <= n; j++) m[r]![j]! -= f * m[c]![j]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let r = n - 1; r >= 0; r--) {
    let s = m[r]![n]!;
    for (let j = r + 1; j < n; j++) s -= m[r]![j]! * x[j]!;
    x[r] = s / m[r]![r]!;
  }
  return x;
}

function weightedLeastSquares(x: readonly number[][], y: readonly number[], w: readonly number[]): number[] | null {
  const p = x[0]!.length;
  const ata = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  const aty = new Array<number>(p).fill(0);
  for (let i = 0; i < y.length; i++) {
    const xi = x[i]!;
    for (let r = 0; r < p; r++) {
      aty[r]! += w[i]! * xi[r]! * y[i]!;
      for (let c = 0; c < p; c++) ata[r]![c]! += w[i]! * xi[r]! * xi[c]!;
    }
  }
  return solve(ata, aty);
}

/**
 * Huber regression of y on the rows of x (include a column of 1s for an
 * intercept) by IRLS; `k = Infinity` gives ordinary least squares.
 * Null when the design is singular (e.g. every day had the same wind).
 */
export function huberRegression(x: readonly number[][], y: readonly number[], k = HUBER_K): RobustFit | null {
  if (y.length === 0 || y.length <= x[0]!.length) return null;
  let w = new Array<number>(y.length).fill(1);
  let coef = weightedLeastSquares(x, y, w);
  if (!coef) return null;
  const yScale = Math.max(1, median(y.map(Math.abs)) ?? 1);
  let scale = 0;
  let it = 0;
  for (; it < 100; it++) {
    const c = coef;
    const r = y.map((yi, i) => yi - x[i]!.reduce((s, xij, j) => s + xij * c[j]!, 0));
    const med = median(r)!;
    scale = Math.max(median(r.map((ri) => Math.abs(ri - med)))! / MAD_TO_SIGMA, 1e-9 * yScale);
    if (k === Infinity) break;
    w = r.map((ri) => Math.min(1, (k * scale) / Math.abs(ri)));
    const next = weightedLeastSquares(x, y, w);
    if (!next) return null;
    const change = Math.max(...next.map((v, j) => Math.abs(v - c[j]!)));
    coef = next;
    if (change < 1e-10 * (1 + Math.max(...next.map(Math.abs)))) break;
  }
  return { coef, scale, weights: w, iterations: it };
}

export interface NormalisationModel {
  /** p95 = coef[0] + coef[1]·W² */
  wind: RobustFit | null;
  /** p95 = coef[0] + coef[1]·W² + coef[2]·U² */
  windCurrent: RobustFit | null;
  baselineDays: number;
}

export function fitNormalisation(baseline: readonly WeatherDay[], minDays = MIN_BASELINE_DAYS): NormalisationModel {
  const withWind = baseline.filter((d) => d.wind_ms != null && Number.isFinite(d.p95));
  const withCurrent = withWind.filter((d) => d.current_ms != null);
  const wind =
    withWind.length >= minDays
      ? huberRegression(withWind.map((d) => [1, d.wind_ms! ** 2]), withWind.map((d) => d.p95))
      : null;
  const windCurrent =
    withCurrent.length >= minDays
      ? huberRegression(withCurrent.map((d) => [1, d.wind_ms! ** 2, d.current_ms! ** 2]), withCurrent.map((d) => d.p95))
      : null;
  return { wind, windCurrent, baselineDays: withWind.length };
}

/** The p95 the baseline expects for a day's weather; null without a fit or weather. */
export function expectedP95(model: NormalisationModel, wind_ms: number | null, current_ms?: number | null): number | null {
  if (wind_ms == null) return null;
  if (current_ms != null && model.windCurrent) {
    const [a, b, c] = model.windCurrent.coef as [number, number, number];
    return a + b * wind_ms ** 2 + c * current_ms ** 2;
  }
  if (!model.wind) return null;
  const [a, b] = model.wind.coef as [number, number];
  return a + b * wind_ms ** 2;
}

/** p95_norm = p95 / expected p95; null when either is missing or expected ≤ 0. */
export function p95Norm(model: NormalisationModel, day: { p95: number | null; wind_ms: number | null; current_ms?: number | null }): number | null {
  if (day.p95 == null) return null;
  const e = expectedP95(model, day.wind_ms, day.current_ms);
  return e !== null && e > 0 ? day.p95 / e : null;
}
