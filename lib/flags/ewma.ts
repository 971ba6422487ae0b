/**
 * The EWMA control chart (S. W. Roberts, "Control chart tests based on
 * geometric moving averages", Technometrics 1 (1959) 239–250), as the
 * NIST/SEMATECH e-Handbook of Statistical Methods, §6.3.2.4 "EWMA Control
 * Charts" gives it:
 *
 *   EWMA_t = λ·Y_t + (1 − λ)·EWMA_{t−1},  EWMA_0 = the target (baseline mean)
 *   UCL/LCL = target ± k·s·√(λ/(2−λ))        (the limits for large t)
 *
 * With time-varying limits: the variance of EWMA_t after t points is
 * s²·λ/(2−λ)·[1 − (1−λ)^(2t)] (J. M. Lucas and M. S. Saccucci, "Exponentially
 * weighted moving average control schemes: properties and enhancements",
 * Technometrics 32 (1990) 1–12), so the limits start narrow (k·s·λ at t = 1)
 * and widen to the handbook's. Without them the first points after a change
 * would be judged against limits that are too wide.
 */

export interface EwmaPoint {
  /** 1-based position in the monitored series. */
  t: number;
  value: number;
  ewma: number;
  ucl: number;
  lcl: number;
  /** EWMA above UCL: 'high'; below LCL: 'low'. */
  signal: 'high' | 'low' | null;
}

export interface EwmaOptions {
  /** Weight of the newest point, 0 < λ ≤ 1. */
  lambda: number;
  /** Limit width in standard deviations of the EWMA. */
  k: number;
  target: number;
  /** Standard deviation of single observations (from the baseline). */
  sigma: number;
  /** Use the large-t limits from the first point (the handbook's worked example); default false. */
  asymptoticLimits?: boolean;
}

/** Half-width of the control limits at point t. */
export function ewmaHalfWidth(o: Pick<EwmaOptions, 'lambda' | 'k' | 'sigma' | 'asymptoticLimits'>, t: number): number {
  const grow = o.asymptoticLimits ? 1 : 1 - (1 - o.lambda) ** (2 * t);
  return o.k * o.sigma * Math.sqrt((o.lambda / (2 - o.lambda)) * grow);
}

export function ewmaChart(values: readonly number[], o: EwmaOptions): EwmaPoint[] {
  if (!(o.lambda > 0 && o.lambda <= 1)) throw new RangeError(`ewma: λ must be in (0, 1], got ${o.lambda}`);
  let ewma = o.target;
  return values.map((value, i) => {
    ewma = o.lambda * value + (1 - o.lambda) * ewma;
    const h = ewmaHalfWidth(o, i + 1);
    const ucl = o.target + h;
    const lcl = o.target - h;
    return { t: i + 1, value, ewma, ucl, lcl, signal: ewma > ucl ? 'high' : ewma < lcl ? 'low' : null };
  });
}
