import { Random } from '../random';

/**
 * A seeded generator for the simulator's inner loop (some 14 normal deviates
 * a simulated second): the uniform deviates of seed/random.ts (mulberry32) and
 * normal deviates by the ziggurat method with 128 layers, G. Marsaglia and
 * W. W. Tsang, "The Ziggurat Method for Generating Random Variables", Journal
 * of Statistical Software 5 (8), 2000 (their RNOR/nfix, with their constants
 * r = 3.442619855899 and v = 9.91256303526217e-3). Nearly every draw costs
 * one 32-bit integer, a comparison and a multiplication. Deterministic for a
 * seed.
 */
const LAYERS = 128;
const R = 3.442619855899;
const V = 9.91256303526217e-3;
const M1 = 2147483648;

const kn = new Int32Array(LAYERS);
const wn = new Float64Array(LAYERS);
const fn = new Float64Array(LAYERS);
{
  // Marsaglia & Tsang's zigset for RNOR.
  let dn = R, tn = R;
  const q = V / Math.exp(-0.5 * dn * dn);
  kn[0] = Math.floor((dn / q) * M1);
  kn[1] = 0;
  wn[0] = q / M1;
  wn[LAYERS - 1] = dn / M1;
  fn[0] = 1;
  fn[LAYERS - 1] = Math.exp(-0.5 * dn * dn);
  for (let i = LAYERS - 2; i >= 1; i--) {
    dn = Math.sqrt(-2 * Math.log(V / dn + Math.exp(-0.5 * dn * dn)));
    kn[i + 1] = Math.floor((dn / tn) * M1);
    tn = dn;
    fn[i] = Math.exp(-0.5 * dn * dn);
    wn[i] = dn / M1;
  }
}

export class SimRandom extends Random {
  override normal(): number {
    const hz = this.int32();
    const iz = hz & (LAYERS - 1);
    if ((hz < 0 ? -hz : hz) < kn[iz]!) return hz * wn[iz]!;
    return this.tail(hz, iz);
  }

  /** The rare draws outside a layer's rectangle (Marsaglia & Tsang's nfix). */
  private tail(hz: number, iz: number): number {
    for (;;) {
      const x = hz * wn[iz]!;
      if (iz === 0) {
        // The base strip: x beyond R from the exponential tail method.
        let t: number, y: number;
        do {
          t = -Math.log(1 - this.next()) / R;
          y = -Math.log(1 - this.next());
        } while (y + y < t * t);
        return hz > 0 ? R + t : -R - t;
      }
      if (fn[iz]! + this.next() * (fn[iz - 1]! - fn[iz]!) < Math.exp(-0.5 * x * x)) return x;
      hz = this.int32();
      iz = hz & (LAYERS - 1);
      if ((hz < 0 ? -hz : hz) < kn[iz]!) return hz * wn[iz]!;
    }
  }

  /** A uniform signed 32-bit integer. */
  private int32(): number {
    return (this.next() * 4294967296) | 0;
  }
}
