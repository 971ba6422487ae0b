/**
 * DP state estimator for the demo simulator (demo data only): one discrete
 * Kalman filter per earth axis (north, east) and one for heading, each with
 * state [position, velocity, bias acceleration]. The prediction uses the
 * vessel model's known acceleration (thrust, wind feed-forward, damping) and
 * the bias absorbs the unexplained slowly varying force (current, wave drift,
 * model error) — the structure of Sørensen 2011 §3 and Fossen 2011 §11.3
 * (Kalman filter with bias states), simplified to decoupled axes. The
 * measurement is the inverse-variance fused reference position.
 *
 * Process noise levels are tuned by hand (common practice, no source).
 */

/** A Kalman correction: x + K·(z − x). With K 0.5 a 1 m residual moves the estimate 0.5 m. */
export function correct(predicted: number, measured: number, gain: number): number {
  return predicted + gain * (measured - predicted);
}

/** Kalman filter for x = [p, v, b] with ṗ = v, v̇ = a + b, ḃ = w_b; measures p. */
export class AxisFilter {
  p = 0;
  v = 0;
  b = 0;
  /** Covariance, symmetric 3×3 stored as the six distinct entries. */
  P00: number;
  P01 = 0;
  P02 = 0;
  P11: number;
  P12 = 0;
  P22: number;
  /** Position gain of the last update. */
  gain = 0;

  constructor(
    private readonly qv: number,
    private readonly qb: number,
    p0 = 1,
  ) {
    this.P00 = p0;
    this.P11 = 0.01;
    this.P22 = 1e-6;
  }

  /** Predict h seconds ahead with known acceleration a. */
  predict(a: number, h: number): void {
    const h2 = 0.5 * h * h;
    this.p += this.v * h + (a + this.b) * h2;
    this.v += (a + this.b) * h;
    // P ← F P Fᵀ + Q, F = [[1, h, h²/2], [0, 1, h], [0, 0, 1]].
    const P00 = this.P00, P01 = this.P01, P02 = this.P02, P11 = this.P11, P12 = this.P12, P22 = this.P22;
    const A00 = P00 + h * P01 + h2 * P02, A01 = P01 + h * P11 + h2 * P12, A02 = P02 + h * P12 + h2 * P22;
    const A11 = P11 + h * P12, A12 = P12 + h * P22;
    const A10 = P01 + h * P02; // row 1 of F P, column 0
    const A20 = P02, A21 = P12, A22 = P22;
    this.P00 = A00 + h * A01 + h2 * A02;
    this.P01 = A10 + h * A11 + h2 * A12;
    this.P02 = A20 + h * A21 + h2 * A22;
    this.P11 = A11 + h * A12 + this.qv * h;
    this.P12 = A21 + h * A22;
    this.P22 = A22 + this.qb * h;
  }

  /** Update with a position measurement z of variance r; `wrap` maps the residual (e.g. angles). */
  update(z: number, r: number, wrap?: (x: number) => number): void {
    let res = z - this.p;
    if (wrap) res = wrap(res);
    const s = this.P00 + r;
    const k0 = this.P00 / s, k1 = this.P01 / s, k2 = this.P02 / s;
    this.gain = k0;
    this.p = correct(this.p, this.p + res, k0);
    this.v += k1 * res;
    this.b += k2 * res;
    // P ← (I − K H) P with H = [1 0 0].
    const P00 = this.P00, P01 = this.P01, P02 = this.P02;
    this.P00 -= k0 * P00;
    this.P01 -= k0 * P01;
    this.P02 -= k0 * P02;
    this.P11 -= k1 * P01;
    this.P12 -= k1 * P02;
    this.P22 -= k2 * P02;
  }
}
