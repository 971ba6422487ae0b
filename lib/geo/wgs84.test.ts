import geodesic from 'geographiclib-geodesic';
import { describe, expect, it } from 'vitest';
import { WGS84_A, WGS84_E2, WGS84_F, geodeticToEcef, latLonFromOffset, offsetFromSetPoint } from './wgs84';

const G = geodesic.Geodesic.WGS84;
const DEG = 180 / Math.PI;
const MM = 1e-3;
const AZ_TOL = 1e-4; // degrees

/** Inverse geodesic problem; Source: GeographicLib (geographiclib-geodesic 2.2.0). */
function inverse(lat1: number, lon1: number, lat2: number, lon2: number) {
  const r = G.Inverse(lat1, lon1, lat2, lon2);
  return { s12: r.s12 ?? NaN, azi1: r.azi1 ?? NaN, azi2: r.azi2 ?? NaN };
}

/** Direct geodesic problem; Source: GeographicLib. Longitude comes back in [−180, 180]. */
function direct(lat1: number, lon1: number, azi1: number, s12: number) {
  const r = G.Direct(lat1, lon1, azi1, s12);
  return { lat2: r.lat2 ?? NaN, lon2: r.lon2 ?? NaN, azi2: r.azi2 ?? NaN };
}

/** Smallest signed difference of two angles, degrees. */
function angleDiff(a: number, b: number): number {
  return ((((a - b) % 360) + 540) % 360) - 180;
}

/** mulberry32: a small seeded generator, so every run checks the same pairs. */
function seeded(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

type Pair = { label: string; spLat: number; spLon: number; lat: number; lon: number };

/** Compares offsetFromSetPoint with GeographicLib's inverse solution for one pair. */
function compare(p: Pair) {
  const { north, east } = offsetFromSetPoint(p.lat, p.lon, p.spLat, p.spLon);
  const ref = inverse(p.spLat, p.spLon, p.lat, p.lon);
  const dist = Math.hypot(north, east);
  return {
    ref,
    distErr: Math.abs(dist - ref.s12),
    // Bearing is only meaningful once the points are apart; the brief fixes 1 m.
    azErr: ref.s12 >= 1 ? Math.abs(angleDiff(Math.atan2(east, north) * DEG, ref.azi1)) : 0,
  };
}

// Set-point neighbourhoods: [label, lat, lon, ± jitter of the set point in degrees].
const REGIONS: [string, number, number, number][] = [
  ['equator', 0, 10, 0.01],
  ['60°N', 60, 5, 0.5],
  ['85°S', -85, -120, 0.5],
  ['antimeridian', 30, 180, 0.0001],
  ['across the equator', 0, -45, 0.0001],
  ['across the prime meridian', 51.5, 0, 0.0001],
  ['89.99°N', 89.99, 70, 0.001],
];

/** Random pairs: set point near a region's centre, position up to 2 km away on a random bearing. */
function randomPairs(seed: number, perRegion: number): Pair[] {
  const rnd = seeded(seed);
  const pairs: Pair[] = [];
  for (const [label, lat0, lon0, jitter] of REGIONS) {
    for (let i = 0; i < perRegion; i++) {
      const spLat = Math.max(-90, Math.min(90, lat0 + (rnd() * 2 - 1) * jitter));
      let spLon = lon0 + (rnd() * 2 - 1) * jitter;
      if (spLon > 180) spLon -= 360;
      // Log-uniform 1 cm … 2 km, so small DP excursions are as well covered as long ones.
      const s = 0.01 * Math.pow(2000 / 0.01, rnd());
      const d = direct(spLat, spLon, rnd() * 360 - 180, s);
      pairs.push({ label, spLat, spLon, lat: d.lat2, lon: d.lon2 });
    }
  }
  return pairs;
}

// Hand-picked pairs at the awkward places.
const EDGE_PAIRS: Pair[] = [
  { label: 'antimeridian, −179.9999 → +179.9999', spLat: 0, spLon: -179.9999, lat: 0, lon: 179.9999 },
  { label: 'antimeridian, +179.9999 → −179.9999 at 60°S', spLat: -60, spLon: 179.9999, lat: -60.001, lon: -179.9999 },
  { label: 'antimeridian, 180 → −179.99', spLat: 12, spLon: 180, lat: 12.005, lon: -179.99 },
  { label: 'equator crossing', spLat: 0.0001, spLon: 3, lat: -0.0001, lon: 3.0001 },
  { label: 'prime meridian crossing', spLat: 57, spLon: -0.0002, lat: 57.0001, lon: 0.0002 },
  { label: 'equator and prime meridian', spLat: 0, spLon: 0, lat: 0.01, lon: -0.01 },
  { label: '85°S due west 1 km-ish', spLat: -85, spLon: 0, lat: -85, lon: -0.1 },
  { label: '85°S due south 1.5 km-ish', spLat: -85, spLon: 45, lat: -85.0135, lon: 45 },
  { label: '60°N 1 m east', spLat: 60, spLon: 5, lat: 60, lon: 5.000018 },
  { label: '60°N 2 km north-east', spLat: 60, spLon: 5, lat: 60.012, lon: 5.024 },
  { label: 'north pole set point', spLat: 90, spLon: 0, lat: 89.99, lon: 30 },
];

describe('offsetFromSetPoint against GeographicLib (random pairs within 2 km)', () => {
  // Source: expected distance s12 and initial azimuth azi1 from
  // geographiclib-geodesic 2.2.0, Geodesic.WGS84.Inverse (C. F. F. Karney's
  // GeographicLib, accurate to ~15 nm on WGS84).
  const pairs = randomPairs(20260304, 300);

  it.each(REGIONS.map(([label]) => label))('%s: distance within 1 mm, bearing within 1e-4°', (label) => {
    const mine = pairs.filter((p) => p.label === label);
    expect(mine.length).toBe(300);
    let maxDist = 0;
    let maxAz = 0;
    let sawOneMetre = 0;
    for (const p of mine) {
      const c = compare(p);
      maxDist = Math.max(maxDist, c.distErr);
      maxAz = Math.max(maxAz, c.azErr);
      if (c.ref.s12 >= 1) sawOneMetre++;
    }
    expect(maxDist).toBeLessThan(MM);
    expect(maxAz).toBeLessThan(AZ_TOL);
    expect(sawOneMetre).toBeGreaterThan(100);
  });

  it.each([
    ['antimeridian', (p: Pair) => Math.sign(p.lon) !== Math.sign(p.spLon)],
    ['across the equator', (p: Pair) => Math.sign(p.lat) !== Math.sign(p.spLat)],
    ['across the prime meridian', (p: Pair) => Math.sign(p.lon) !== Math.sign(p.spLon)],
  ] as const)('the %s pairs really straddle the line', (label, straddles) => {
    const straddling = pairs.filter((p) => p.label === label && straddles(p));
    expect(straddling.length).toBeGreaterThan(50);
  });
});

describe('offsetFromSetPoint against GeographicLib (edge cases)', () => {
  // Source: geographiclib-geodesic 2.2.0, Geodesic.WGS84.Inverse.
  it.each(EDGE_PAIRS.map((p) => [p.label, p] as const))('%s', (_label, p) => {
    const c = compare(p);
    expect(c.ref.s12).toBeLessThan(2000);
    expect(c.ref.s12).toBeGreaterThan(1);
    expect(c.distErr).toBeLessThan(MM);
    expect(c.azErr).toBeLessThan(AZ_TOL);
  });

  it('−179.9999 → +179.9999 on the equator is 22 m west, not 40 000 km east', () => {
    const { north, east } = offsetFromSetPoint(0, 179.9999, 0, -179.9999);
    // Source: an equatorial arc is a·Δλ (Δλ = 0.0002° west); a = 6378137 m.
    expect(east).toBeCloseTo(-WGS84_A * 0.0002 / DEG, 6);
    expect(Math.abs(north)).toBeLessThan(1e-6);
  });
});

describe('published examples: Karney, "Algorithms for geodesics", J. Geodesy 87 (2013) 43–55', () => {
  // First prove the reference library reproduces the paper, then use it.
  it('GeographicLib reproduces Table 2 (direct: φ1 = 40°, α1 = 30°, s12 = 10 000 km)', () => {
    // Source: Karney (2013) Table 2: φ2 = 41.79331020506°, λ12 = 137.84490004377°, α2 = 149.09016931807°.
    const d = direct(40, 0, 30, 10e6);
    expect(Math.abs(d.lat2 - 41.79331020506)).toBeLessThan(0.6e-11);
    expect(Math.abs(d.lon2 - 137.84490004377)).toBeLessThan(0.6e-11);
    expect(Math.abs(d.azi2 - 149.09016931807)).toBeLessThan(0.6e-11);
  });

  it('GeographicLib reproduces Table 3 (short inverse: φ1 = −30.12345°, φ2 = −30.12344°, λ12 = 0.00005°)', () => {
    // Source: Karney (2013) Table 3: α1 = 77.043533°, α2 = 77.043508°, s12 = 4.944208 m (printed to 6 decimals).
    const r = inverse(-30.12345, 0, -30.12344, 0.00005);
    expect(Math.abs(r.azi1 - 77.043533)).toBeLessThan(0.6e-6);
    expect(Math.abs(r.azi2 - 77.043508)).toBeLessThan(0.6e-6);
    expect(Math.abs(r.s12 - 4.944208)).toBeLessThan(0.6e-6);
  });

  it('GeographicLib reproduces Tables 4–6 (nearly antipodal inverse: φ1 = −30°, φ2 = 29.9°, λ12 = 179.8°)', () => {
    // Source: Karney (2013) Tables 5–6, final iteration: α1 = 161.89052473633°,
    // α2 = 18.09073724574°, s12 = 19 989 832.827610 m.
    const r = inverse(-30, 0, 29.9, 179.8);
    expect(Math.abs(r.azi1 - 161.89052473633)).toBeLessThan(0.6e-11);
    expect(Math.abs(r.azi2 - 18.09073724574)).toBeLessThan(0.6e-11);
    expect(Math.abs(r.s12 - 19989832.82761)).toBeLessThan(0.6e-6);
  });

  it.each([0, 2, -179.99997, 179.99997])(
    'offsetFromSetPoint reproduces Table 3 with the set point at λ = %f',
    (lon1) => {
      // Source: Karney (2013) Table 3, s12 = 4.944208 m, α1 = 77.043533°; only λ12 matters.
      let lon2 = lon1 + 0.00005;
      if (lon2 > 180) lon2 -= 360;
      const { north, east } = offsetFromSetPoint(-30.12344, lon2, -30.12345, lon1);
      expect(Math.abs(Math.hypot(north, east) - 4.944208)).toBeLessThan(MM);
      expect(Math.abs(Math.atan2(east, north) * DEG - 77.043533)).toBeLessThan(AZ_TOL);
    },
  );
});

describe('exact cases', () => {
  it.each([
    [0, 0],
    [59.9, 5.1],
    [-85, -120],
    [90, 0],
    [-90, 123],
    [10, 180],
    [-10, -180],
  ])('the set point itself is (0, 0) at %f, %f', (lat, lon) => {
    // Source: definition — the vector from a point to itself is zero.
    const { north, east } = offsetFromSetPoint(lat, lon, lat, lon);
    expect(Math.abs(north)).toBe(0);
    expect(Math.abs(east)).toBe(0);
  });

  it('+180 and −180 are the same meridian', () => {
    // Source: definition — both longitudes name the same points; ECEF differs only by rounding of sin(±π).
    const { north, east } = offsetFromSetPoint(45, 180, 45, -180);
    expect(Math.hypot(north, east)).toBeLessThan(1e-6);
  });

  /** Meridian arc from φ1 to φ2 (degrees) by Simpson's rule on M(φ) = a(1 − e²)/(1 − e² sin²φ)^{3/2}. */
  function meridianArc(lat1: number, lat2: number): number {
    const m = (deg: number) => {
      const s = Math.sin(deg / DEG);
      return (WGS84_A * (1 - WGS84_E2)) / Math.pow(1 - WGS84_E2 * s * s, 1.5);
    };
    const n = 200;
    const h = (lat2 - lat1) / n;
    let sum = m(lat1) + m(lat2);
    for (let i = 1; i < n; i++) sum += (i % 2 ? 4 : 2) * m(lat1 + i * h);
    return (sum * h) / 3 / DEG;
  }

  it.each([
    [0, 0, 1000],
    [-0.005, 33, 1111.1],
    [45, -60, 2000],
    [60, 5, 1],
    [-85, 179.9, 1500],
  ])('due north from (%f, %f) by %f m: north = meridian arc, east = 0', (lat, lon, s) => {
    // Source: the end point from GeographicLib Direct along azimuth 0; the arc
    // length checked twice — against s12 itself and against the integral of
    // the meridian radius of curvature M(φ) (standard result, from memory).
    const d = direct(lat, lon, 0, s);
    expect(d.lon2).toBeCloseTo(lon, 12);
    const { north, east } = offsetFromSetPoint(d.lat2, lon, lat, lon);
    expect(Math.abs(north - s)).toBeLessThan(MM);
    expect(Math.abs(north - meridianArc(lat, d.lat2))).toBeLessThan(MM);
    expect(Math.abs(east)).toBeLessThan(1e-9);
  });
});

describe('why the ellipsoid', () => {
  it('a spherical degrees-to-metres conversion misses a 1 km north offset at the equator by over 5 m', () => {
    // Source: GeographicLib Direct for the end point; the spherical mean radius 6 371 008.8 m (IUGG R1).
    const d = direct(0, 0, 0, 1000);
    const spherical = (d.lat2 / DEG) * 6371008.8;
    expect(spherical - 1000).toBeGreaterThan(5);
    expect(Math.abs(offsetFromSetPoint(d.lat2, 0, 0, 0).north - 1000)).toBeLessThan(MM);
  });

  it('uses the WGS84 defining constants', () => {
    // Source: NIMA TR8350.2 (3rd ed.) Table 3.1; identical in GeographicLib's Geodesic.WGS84.
    expect(WGS84_A).toBe(6378137);
    expect(1 / WGS84_F).toBeCloseTo(298.257223563, 9);
    expect(G.a).toBe(WGS84_A);
    expect(G.f).toBe(WGS84_F);
    const e = geodeticToEcef(0, 0);
    expect(e).toEqual({ x: WGS84_A, y: 0, z: 0 });
  });
});

describe('latLonFromOffset', () => {
  // Source: round trip through offsetFromSetPoint (itself checked against geographiclib above).
  it('is the inverse of offsetFromSetPoint to within a millimetre for DP-sized offsets', () => {
    for (const [lat, lon] of [[0, 0], [59.4, 2.9], [-45, 170], [75, -20]] as const) {
      for (const [north, east] of [[0, 0], [3, -4], [-25, 12], [40, 30]] as const) {
        const p = latLonFromOffset(lat, lon, north, east);
        const back = offsetFromSetPoint(p.lat, p.lon, lat, lon);
        expect(Math.abs(back.north - north)).toBeLessThan(1e-3);
        expect(Math.abs(back.east - east)).toBeLessThan(1e-3);
      }
    }
  });
});
