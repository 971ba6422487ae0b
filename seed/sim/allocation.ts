import type { ThrusterSpec } from './thrusters';

/**
 * Thrust allocation for the demo simulator (demo data only): the weighted
 * pseudo-inverse of the extended thrust configuration matrix, Fossen 2011
 * §12.3.2 (unconstrained allocation, eq. 12.252) — azimuthing units become two
 * virtual thrusters (surge and sway components), tunnels act in sway only,
 * main propellers in surge only. Weights 1/T_max² let big units take more of
 * the load. Saturation: the whole demand is scaled down until the most loaded
 * unit is at its limit (keeps the force direction; a simple choice, common
 * practice, no source — Sørensen 2011 §4.5 lists better ones).
 *
 * Thruster bias (common DP practice, no source): on vessels whose azimuths
 * sit symmetrically about midships, each azimuth may add a thrust pointing
 * away from midships, the same fraction of its rating for all, so the bias
 * cancels in surge, sway and yaw while keeping the units loaded and ready to
 * respond. It fades out as the largest unit demand grows to half its rating.
 */
export class Allocator {
  /** Virtual-thruster pseudo-inverse rows (m × 3, row-major). */
  private readonly pinv: Float64Array;
  /** Column index of each unit's first virtual thruster. */
  private readonly col: Int32Array;
  private readonly u: Float64Array;
  readonly cmdThrust: Float64Array;
  readonly cmdAngle: Float64Array;
  /** Unit vector from midships to each azimuth (zero for other units, or when the bias would not cancel). */
  private readonly radial: Float64Array;
  /** Bias thrust as a fraction of each azimuth's rating (0: none). Only takes effect when `canBias`. */
  bias = 0;
  readonly canBias: boolean;

  constructor(private readonly specs: readonly ThrusterSpec[]) {
    const cols: { unit: number; fx: number; fy: number; mz: number; w: number }[] = [];
    this.col = new Int32Array(specs.length);
    specs.forEach((s, i) => {
      this.col[i] = cols.length;
      const w = s.maxThrust * s.maxThrust;
      if (s.azimuthing) {
        cols.push({ unit: i, fx: 1, fy: 0, mz: -s.y, w });
        cols.push({ unit: i, fx: 0, fy: 1, mz: s.x, w });
      } else {
        const c = Math.cos(s.fixedAngle), n = Math.sin(s.fixedAngle);
        cols.push({ unit: i, fx: c, fy: n, mz: s.x * n - s.y * c, w });
      }
    });
    const m = cols.length;
    // A = B W⁻¹ Bᵀ (3 × 3); scale moments by a length to keep it well conditioned.
    const A = new Float64Array(9);
    for (const c of cols) {
      const b = [c.fx, c.fy, c.mz];
      for (let r = 0; r < 3; r++) for (let k = 0; k < 3; k++) A[r * 3 + k]! += b[r]! * c.w * b[k]!;
    }
    const Ai = invert3(A);
    this.pinv = new Float64Array(m * 3);
    cols.forEach((c, j) => {
      const b = [c.fx, c.fy, c.mz];
      for (let k = 0; k < 3; k++) {
        let s = 0;
        for (let r = 0; r < 3; r++) s += b[r]! * Ai[r * 3 + k]!;
        this.pinv[j * 3 + k] = c.w * s;
      }
    });
    this.u = new Float64Array(m);
    this.cmdThrust = new Float64Array(specs.length);
    this.cmdAngle = new Float64Array(specs.length);
    this.radial = new Float64Array(2 * specs.length);
    let sx = 0, sy = 0, sum = 0, count = 0;
    specs.forEach((s, i) => {
      const r = Math.sqrt(s.x * s.x + s.y * s.y);
      if (!s.azimuthing || r === 0) return;
      this.radial[2 * i] = s.x / r;
      this.radial[2 * i + 1] = s.y / r;
      sx += s.maxThrust * this.radial[2 * i]!;
      sy += s.maxThrust * this.radial[2 * i + 1]!;
      sum += s.maxThrust;
      count++;
    });
    // Radial vectors pass through midships (no yaw moment); they must also add up to no force.
    this.canBias = count >= 4 && Math.sqrt(sx * sx + sy * sy) < 1e-6 * sum;
    if (!this.canBias) this.radial.fill(0);
  }

  /**
   * The largest pure surge (N), sway (N) or yaw (N·m) demand this allocation
   * can meet with no unit beyond its rating (axis 0, 1, 2).
   */
  capacity(axis: 0 | 1 | 2): number {
    const p = this.pinv, u = this.u;
    for (let j = 0; j < u.length; j++) u[j] = p[j * 3 + axis]!;
    let worst = 0;
    for (let i = 0; i < this.specs.length; i++) {
      const s = this.specs[i]!;
      const j = this.col[i]!;
      // Either sign of the demand: take the weaker direction.
      const t = s.azimuthing ? Math.hypot(u[j]!, u[j + 1]!) / s.maxThrust : Math.abs(u[j]!) / Math.min(s.maxThrust, s.maxReverse);
      if (t > worst) worst = t;
    }
    return worst > 0 ? 1 / worst : 0;
  }

  /**
   * Allocate the body-frame demand (N, N, N·m) to units. `angleNow` holds the
   * current azimuth angles (kept when an azimuth has almost nothing to do).
   * Returns the saturation scale applied (1 = none).
   */
  allocate(x: number, y: number, n: number, angleNow: Float64Array): number {
    const p = this.pinv, u = this.u;
    for (let j = 0; j < u.length; j++) u[j] = p[j * 3]! * x + p[j * 3 + 1]! * y + p[j * 3 + 2]! * n;
    let fade = 0;
    if (this.bias > 0 && this.canBias) {
      let most = 0;
      for (let i = 0; i < this.specs.length; i++) {
        const s = this.specs[i]!, j = this.col[i]!;
        if (!s.azimuthing) continue;
        const r = Math.sqrt(u[j]! * u[j]! + u[j + 1]! * u[j + 1]!) / s.maxThrust;
        if (r > most) most = r;
      }
      fade = most < 0.5 ? this.bias * (1 - 2 * most) : 0;
    }
    let worst = 1;
    for (let i = 0; i < this.specs.length; i++) {
      const s = this.specs[i]!;
      const j = this.col[i]!;
      let t: number;
      if (s.azimuthing) {
        const ux = u[j]! + fade * s.maxThrust * this.radial[2 * i]!, uy = u[j + 1]! + fade * s.maxThrust * this.radial[2 * i + 1]!;
        t = Math.sqrt(ux * ux + uy * uy);
        this.cmdAngle[i] = t > 0.01 * s.maxThrust ? Math.atan2(uy, ux) : angleNow[i]!;
      } else {
        t = u[j]!;
        this.cmdAngle[i] = s.fixedAngle;
      }
      this.cmdThrust[i] = t;
      const ratio = t >= 0 ? t / s.maxThrust : -t / s.maxReverse;
      if (ratio > worst) worst = ratio;
    }
    if (worst > 1) for (let i = 0; i < this.specs.length; i++) this.cmdThrust[i] = this.cmdThrust[i]! / worst;
    return 1 / worst;
  }
}

/**
 * Body-frame force (N, N, N·m) of the units' actual thrust and angles, into
 * out[0..2]; `cos`/`sin` may carry the angles' precomputed cosines and sines.
 */
export function thrustForce(
  specs: readonly ThrusterSpec[],
  thrust: Float64Array,
  angle: Float64Array,
  out: Float64Array,
  cos?: Float64Array,
  sin?: Float64Array,
): void {
  let x = 0, y = 0, n = 0;
  for (let i = 0; i < specs.length; i++) {
    const s = specs[i]!;
    const c = cos ? cos[i]! : Math.cos(angle[i]!), sn = sin ? sin[i]! : Math.sin(angle[i]!);
    const fx = thrust[i]! * c, fy = thrust[i]! * sn;
    x += fx;
    y += fy;
    n += s.x * fy - s.y * fx;
  }
  out[0] = x;
  out[1] = y;
  out[2] = n;
}

function invert3(a: Float64Array): Float64Array {
  const [a0, a1, a2, a3, a4, a5, a6, a7, a8] = a as unknown as number[];
  const c0 = a4! * a8! - a5! * a7!, c1 = a5! * a6! - a3! * a8!, c2 = a3! * a7! - a4! * a6!;
  const det = a0! * c0 + a1! * c1 + a2! * c2;
  if (Math.abs(det) < 1e-300) throw new Error('thrust configuration cannot produce surge, sway and yaw');
  const r = new Float64Array(9);
  r[0] = c0 / det;
  r[1] = (a2! * a7! - a1! * a8!) / det;
  r[2] = (a1! * a5! - a2! * a4!) / det;
  r[3] = c1 / det;
  r[4] = (a0! * a8! - a2! * a6!) / det;
  r[5] = (a2! * a3! - a0! * a5!) / det;
  r[6] = c2 / det;
  r[7] = (a1! * a6! - a0! * a7!) / det;
  r[8] = (a0! * a4! - a1! * a3!) / det;
  return r;
}
