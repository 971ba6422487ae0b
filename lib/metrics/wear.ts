/**
 * Thruster wear: load-weighted equivalent hours at rated load, and the
 * ISO 281 basic rating life it rests on.
 *
 * Sources.
 * - docs spec metrics-v1 "Thruster wear": wear_hours =
 *   Σ_b load_band_s[b]/3600 · (m_b/100)^p, m_b = 5, 15, … 95 % and 105 % for
 *   the top band (≥ 100 %), p the life exponent set per thruster (default 3;
 *   10/3 for roller bearings), an optional floor for idle running.
 * - ISO 281:2007 basic rating life: L10 = (C/P)^p millions of revolutions,
 *   L10h = 10^6 / (60·n) · L10 hours at n rpm (p = 3 ball, 10/3 roller
 *   bearings). Since life ∝ P^−p, one hour at load fraction x uses x^p hours
 *   of the life at rated load; summing such fractions over load bands is the
 *   Palmgren–Miner linear damage rule (the spec's wording; ISO 281's own
 *   variable-load formula is equivalent for a constant speed).
 *
 * Choices the spec leaves open (docs to mirror them):
 * - Idle floor: a band's factor is max((m_b/100)^p, floor); with floor f,
 *   every running hour counts at least f wear hours. Default: no floor (0).
 * - An interval without `load_band_s`: if it did not run (run_s = 0) its wear
 *   is 0 (the contract lets a stopped unit omit the bands); if it ran, its
 *   wear is unknown → null, never 0. A day's sum skips unknown intervals and
 *   reports the run time they hide (`unbanded_run_s`); the day is null only
 *   when no interval's wear is known.
 */

export const LOAD_BANDS = 11;
/** Band mid-loads m_b in % of rated power. */
export const BAND_MID_PCT: readonly number[] = [5, 15, 25, 35, 45, 55, 65, 75, 85, 95, 105];
export const DEFAULT_LIFE_EXPONENT = 3;
export const ROLLER_LIFE_EXPONENT = 10 / 3;

export interface WearOptions {
  /** Life exponent p (> 0); default 3. */
  p?: number;
  /** Minimum wear hours per running hour (0..1); default 0. */
  idleFloor?: number;
}

function bandFactors({ p = DEFAULT_LIFE_EXPONENT, idleFloor = 0 }: WearOptions): number[] {
  if (!(p > 0) || !Number.isFinite(p)) throw new RangeError(`life exponent must be > 0, got ${p}`);
  if (!(idleFloor >= 0 && idleFloor <= 1)) throw new RangeError(`idle floor must be in [0, 1], got ${idleFloor}`);
  return BAND_MID_PCT.map((m) => Math.max((m / 100) ** p, idleFloor));
}

/** Wear hours of one interval's `load_band_s` (11 numbers of seconds). */
export function wearHoursOfBands(loadBandS: readonly number[], options: WearOptions = {}): number {
  if (loadBandS.length !== LOAD_BANDS) throw new RangeError(`load_band_s must have ${LOAD_BANDS} bands, got ${loadBandS.length}`);
  const f = bandFactors(options);
  let s = 0;
  for (let b = 0; b < LOAD_BANDS; b++) s += (loadBandS[b]! / 3600) * f[b]!;
  return s;
}

export interface WearInterval {
  run_s: number;
  load_band_s?: readonly number[] | null;
}

/** Wear hours of one interval: 0 when it did not run and sent no bands, null when it ran without bands. */
export function intervalWearHours(u: WearInterval, options: WearOptions = {}): number | null {
  if (u.load_band_s) return wearHoursOfBands(u.load_band_s, options);
  return u.run_s > 0 ? null : 0;
}

export interface WearSum {
  /** Σ wear hours of the intervals whose wear is known; null when none is. */
  wear_hours: number | null;
  /** Seconds run in intervals without load bands (not in wear_hours). */
  unbanded_run_s: number;
}

export function sumWearHours(intervals: Iterable<WearInterval>, options: WearOptions = {}): WearSum {
  bandFactors(options); // validate once, even for an empty day
  let wear: number | null = null;
  let unbanded = 0;
  for (const u of intervals) {
    const w = intervalWearHours(u, options);
    if (w === null) unbanded += u.run_s;
    else wear = (wear ?? 0) + w;
  }
  return { wear_hours: wear, unbanded_run_s: unbanded };
}

/** ISO 281 basic rating life L10 in millions of revolutions: (C/P)^p. */
export function l10MillionRevolutions(dynamicLoadRatingC: number, equivalentLoadP: number, p = DEFAULT_LIFE_EXPONENT): number {
  if (!(dynamicLoadRatingC > 0) || !(equivalentLoadP > 0)) throw new RangeError('C and P must be > 0');
  return (dynamicLoadRatingC / equivalentLoadP) ** p;
}

/** ISO 281 basic rating life in operating hours at `rpm`: 10^6 / (60·n) · L10. */
export function l10Hours(dynamicLoadRatingC: number, equivalentLoadP: number, rpm: number, p = DEFAULT_LIFE_EXPONENT): number {
  if (!(rpm > 0)) throw new RangeError(`rpm must be > 0, got ${rpm}`);
  return (1e6 / (60 * rpm)) * l10MillionRevolutions(dynamicLoadRatingC, equivalentLoadP, p);
}
