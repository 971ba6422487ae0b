/**
 * The error function and the standard normal distribution, for the p-values
 * of the Mann–Kendall test and the confidence limits of Sen's slope.
 *
 * Method (exact series, no fitted coefficients):
 * - |x| < 3: the Maclaurin series erf x = (2/√π) Σ (−1)ⁿ x²ⁿ⁺¹ / (n!(2n+1))
 *   (M. Abramowitz and I. A. Stegun, Handbook of Mathematical Functions,
 *   NBS 1964, eq. 7.1.5). At x = 3 the largest term is about 3·10³, so the
 *   sum keeps about 12 correct digits in double precision.
 * - |x| ≥ 3: the continued fraction for erfc (Abramowitz and Stegun eq.
 *   7.1.14), erfc x = (e^(−x²)/√π) · 1/(x + (1/2)/(x + 1/(x + (3/2)/(x + 2/(x + …))))),
 *   evaluated from the tail with 200 levels, far more than it needs there.
 *   Working on erfc keeps the tiny upper-tail probabilities accurate (no
 *   1 − 0.999… cancellation).
 * Checked against Abramowitz and Stegun's Table 7.1 and Table 26.1 in
 * normal.test.ts.
 */

const TWO_OVER_SQRT_PI = 2 / Math.sqrt(Math.PI);
const SERIES_LIMIT = 3;
const FRACTION_LEVELS = 200;

function erfSeries(x: number): number {
  const x2 = x * x;
  let term = x; // (−1)ⁿ x²ⁿ⁺¹ / n!
  let sum = x;
  for (let n = 1; n < 200; n++) {
    term *= -x2 / n;
    const add = term / (2 * n + 1);
    sum += add;
    if (Math.abs(add) < 1e-17 * Math.abs(sum)) break;
  }
  return TWO_OVER_SQRT_PI * sum;
}

/** erfc x for x ≥ SERIES_LIMIT by the continued fraction 7.1.14, evaluated bottom-up. */
function erfcFraction(x: number): number {
  let tail = x;
  for (let k = FRACTION_LEVELS; k >= 1; k--) tail = x + k / 2 / tail;
  return Math.exp(-x * x) / Math.sqrt(Math.PI) / tail;
}

export function erf(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (Math.abs(x) < SERIES_LIMIT) return erfSeries(x);
  const c = erfcFraction(Math.abs(x));
  return x > 0 ? 1 - c : c - 1;
}

/** erfc x = 1 − erf x, accurate in the upper tail. */
export function erfc(x: number): number {
  if (Number.isNaN(x)) return NaN;
  if (x >= SERIES_LIMIT) return erfcFraction(x);
  if (x <= -SERIES_LIMIT) return 2 - erfcFraction(-x);
  return 1 - erfSeries(x);
}

/** Φ(z), the standard normal distribution function: Φ(z) = ½·erfc(−z/√2) (Abramowitz and Stegun eq. 26.2.29 with 7.1.2). */
export function normalCdf(z: number): number {
  return 0.5 * erfc(-z / Math.SQRT2);
}

/** 1 − Φ(z), computed without cancellation. */
export function normalUpperTail(z: number): number {
  return 0.5 * erfc(z / Math.SQRT2);
}

/**
 * z with Φ(z) = p, 0 < p < 1, by bisection on normalCdf: no second
 * approximation to trust, and only a few calls per evaluation (for Sen's
 * slope confidence limits), so speed does not matter.
 */
export function normalQuantile(p: number): number {
  if (!(p > 0 && p < 1)) throw new RangeError(`normalQuantile: p must be in (0, 1), got ${p}`);
  let lo = -40;
  let hi = 40;
  for (let i = 0; i < 200 && hi - lo > 1e-15 * Math.max(1, Math.abs(lo)); i++) {
    const mid = (lo + hi) / 2;
    if (normalCdf(mid) < p) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2;
}
