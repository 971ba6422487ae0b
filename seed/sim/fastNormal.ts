import { Random } from '../random';

/**
 * A seeded generator for the simulator's inner loop: the uniform deviates of
 * seed/random.ts (mulberry32) with normal deviates by Marsaglia's polar
 * method (G. Marsaglia and T. A. Bray, SIAM Review 6 (1964) 260–264), which
 * avoids the sine and cosine of Box–Muller. Deterministic for a seed.
 */
const BLOCK = 1024;

export class SimRandom extends Random {
  /** Normal deviates made a block at a time: small enough to inline, so no boxed numbers per call. */
  private readonly block = new Float64Array(BLOCK);
  private at = BLOCK;

  override normal(): number {
    if (this.at === BLOCK) this.refill();
    return this.block[this.at++]!;
  }

  private refill(): void {
    const b = this.block;
    for (let i = 0; i < BLOCK; i += 2) {
      let u: number, v: number, s: number;
      do {
        u = 2 * this.next() - 1;
        v = 2 * this.next() - 1;
        s = u * u + v * v;
      } while (s >= 1 || s === 0);
      const f = Math.sqrt((-2 * Math.log(s)) / s);
      b[i] = u * f;
      b[i + 1] = v * f;
    }
    this.at = 0;
  }
}
