/**
 * WGS84 geodesy for the `track` stream: a position's north/east offset, in
 * metres, from its DP set point (docs: spec telemetry-v1, stream `track`).
 *
 * Method. Both points go to Earth-centred, Earth-fixed (ECEF) coordinates on
 * the WGS84 ellipsoid at height 0 (sea surface); the difference vector is
 * rotated into the local tangent plane at the set point (East-North-Up), and
 * East/North are returned. Up is dropped: it is the Earth's curvature under
 * the offset (about s²/2R, 7 mm at 300 m), not a horizontal error.
 *
 * Why the ellipsoid and not "degrees × 111 km". At DP scales (metres to a few
 * hundred metres) the horizontal ENU vector matches the geodesic (shortest
 * path on the ellipsoid) to far below a millimetre: the length falls short by
 * about s³/6R², 0.03 mm at 2 km, and its bearing is the normal-section
 * azimuth, which differs from the geodesic azimuth by a negligible amount at
 * these ranges (lib/geo/wgs84.test.ts checks both against GeographicLib).
 * A spherical conversion with the mean radius 6 371 km is wrong by up to
 * about 0.5 %: the meridian radius of curvature is 6 335 km at the equator
 * and 6 400 km at the poles, so north offsets near the equator come out
 * 0.56 % too long — 0.5 m in a 100 m excursion, and a skewed footprint.
 * ECEF also needs no special cases: longitudes either side of the
 * antimeridian (−179.9999 / +179.9999) or close to a pole give the right
 * small vector because sin/cos of the longitude are continuous there.
 *
 * Sources.
 * - a and f: NIMA TR8350.2, "Department of Defense World Geodetic System
 *   1984", 3rd ed. (2000), Table 3.1; the same values define the ellipsoid
 *   of EPSG:4326 (EPSG:7030).
 * - Geodetic → ECEF and the ECEF → ENU rotation: standard results, written
 *   from memory (no page of a textbook was checked); they are proven by the
 *   tests against GeographicLib and the worked examples of C. F. F. Karney,
 *   "Algorithms for geodesics", J. Geodesy 87 (2013) 43–55, not by citation.
 *
 * Pure functions; angles in degrees, lengths in metres.
 */

/** Semi-major axis, m (NIMA TR8350.2 Table 3.1). */
export const WGS84_A = 6378137;
/** Flattening (NIMA TR8350.2 Table 3.1). */
export const WGS84_F = 1 / 298.257223563;
/** First eccentricity squared, e² = f(2 − f). */
export const WGS84_E2 = WGS84_F * (2 - WGS84_F);

const RAD = Math.PI / 180;

export type Ecef = { x: number; y: number; z: number };
export type Enu = { east: number; north: number; up: number };

function checkLatLon(lat: number, lon: number): void {
  if (!Number.isFinite(lat) || !Number.isFinite(lon) || Math.abs(lat) > 90) {
    throw new RangeError(`invalid position lat=${lat} lon=${lon}`);
  }
}

/**
 * Geodetic latitude/longitude (degrees) and ellipsoidal height (m) to ECEF
 * metres: N = a / √(1 − e² sin²φ) is the prime-vertical radius of curvature;
 * x = (N + h) cosφ cosλ, y = (N + h) cosφ sinλ, z = (N(1 − e²) + h) sinφ.
 */
export function geodeticToEcef(lat: number, lon: number, h = 0): Ecef {
  checkLatLon(lat, lon);
  const phi = lat * RAD;
  const lam = lon * RAD;
  const sinPhi = Math.sin(phi);
  const cosPhi = Math.cos(phi);
  const n = WGS84_A / Math.sqrt(1 - WGS84_E2 * sinPhi * sinPhi);
  return {
    x: (n + h) * cosPhi * Math.cos(lam),
    y: (n + h) * cosPhi * Math.sin(lam),
    z: (n * (1 - WGS84_E2) + h) * sinPhi,
  };
}

/**
 * Rotates the ECEF vector from `origin` to `point` into the East-North-Up
 * frame at the origin, whose geodetic latitude/longitude are lat0/lon0:
 *   e = −sinλ·dx + cosλ·dy
 *   n = −sinφ cosλ·dx − sinφ sinλ·dy + cosφ·dz
 *   u =  cosφ cosλ·dx + cosφ sinλ·dy + sinφ·dz
 */
export function ecefToEnu(point: Ecef, origin: Ecef, lat0: number, lon0: number): Enu {
  checkLatLon(lat0, lon0);
  const dx = point.x - origin.x;
  const dy = point.y - origin.y;
  const dz = point.z - origin.z;
  const sinPhi = Math.sin(lat0 * RAD);
  const cosPhi = Math.cos(lat0 * RAD);
  const sinLam = Math.sin(lon0 * RAD);
  const cosLam = Math.cos(lon0 * RAD);
  return {
    east: -sinLam * dx + cosLam * dy,
    north: -sinPhi * cosLam * dx - sinPhi * sinLam * dy + cosPhi * dz,
    up: cosPhi * cosLam * dx + cosPhi * sinLam * dy + sinPhi * dz,
  };
}

/**
 * North/east offset (m) of a position from its set point, both at sea level:
 * positive north = vessel north of the set point, as in the `station` stream's
 * err.north_mean / err.east_mean. Bearing from the set point is
 * atan2(east, north); radial error is √(north² + east²).
 */
export function offsetFromSetPoint(
  lat: number,
  lon: number,
  spLat: number,
  spLon: number,
): { north: number; east: number } {
  const enu = ecefToEnu(geodeticToEcef(lat, lon), geodeticToEcef(spLat, spLon), spLat, spLon);
  return { north: enu.north, east: enu.east };
}

/**
 * The position `north`, `east` metres from an origin, using the ellipsoid's
 * meridian and prime-vertical radii of curvature at the origin (standard
 * result, from memory). The inverse of `offsetFromSetPoint` to within about
 * s²/R (under 1 mm for offsets of tens of metres); for demo positions and
 * short offsets, not for surveying.
 */
export function latLonFromOffset(originLat: number, originLon: number, north: number, east: number): { lat: number; lon: number } {
  const phi = (originLat * Math.PI) / 180;
  const s = Math.sin(phi);
  const w = Math.sqrt(1 - WGS84_E2 * s * s);
  const meridianRadius = (WGS84_A * (1 - WGS84_E2)) / (w * w * w);
  const primeVerticalRadius = WGS84_A / w;
  return {
    lat: originLat + (north / meridianRadius) * (180 / Math.PI),
    lon: originLon + (east / (primeVerticalRadius * Math.cos(phi))) * (180 / Math.PI),
  };
}
