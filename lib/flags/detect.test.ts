import { describe, expect, it } from 'vitest';
import { DEFAULT_FLAG_SETTINGS } from './config';
import { detect, lineEnd, minimumChange, movingRangeSigma } from './detect';
import { addDays } from '../time/fleetDay';

const S = DEFAULT_FLAG_SETTINGS;
const series = { enabled: true, minRelativeChange: 0.05, minAbsoluteChange: 0, weatherAdjust: false, logScale: false, maxBaselineScatter: null, baselineWeatherOnly: false, weatherBeam: false };
const days = (from: string, values: number[]) => values.map((value, i) => ({ day: addDays(from, i), value }));
/** Deterministic scatter of ±1 % (no source: a fixed pattern so the test cannot flake). */
const wobble = (i: number) => 0.01 * Math.sin(i * 2.39996);

describe('detect (both methods must agree to open)', () => {
  const baseline = days('2026-04-01', Array.from({ length: 30 }, (_, i) => 1.7 * (1 + wobble(i))));

  it('stays quiet on a flat series', () => {
    const window = days('2026-05-01', Array.from({ length: 30 }, (_, i) => 1.7 * (1 + wobble(i + 30))));
    const d = detect(window, baseline, 'falling', series, S, { from: '2026-05-01', to: '2026-05-30' })!;
    expect(d.holds).toBe(false);
    expect(d.either).toBe(false);
  });

  it('opens on a fall of 1 %/day over the last 10 days, by both methods', () => {
    const window = days('2026-05-01', Array.from({ length: 30 }, (_, i) => 1.7 * (1 + wobble(i + 30)) * (1 - 0.01 * Math.max(0, i - 19))));
    const d = detect(window, baseline, 'falling', series, S, { from: '2026-05-01', to: '2026-05-30' })!;
    expect(d.trend!.holds).toBe(true);
    expect(d.ewma!.holds).toBe(true);
    expect(d.holds).toBe(true);
    // …and not in the other direction.
    expect(detect(window, baseline, 'rising', series, S, { from: '2026-05-01', to: '2026-05-30' })!.either).toBe(false);
  });

  it('opens sooner by the fast path: a fall of 1 %/day over the last 8 days, CUSUM confirmed by the rank-sum test', () => {
    const window = days('2026-05-01', Array.from({ length: 30 }, (_, i) => 1.7 * (1 + wobble(i + 30)) * (1 - 0.01 * Math.max(0, i - 21))));
    const d = detect(window, baseline, 'falling', series, S, { from: '2026-05-01', to: '2026-05-30' })!;
    // Too early for both slow methods together…
    expect(d.trend!.holds && d.ewma!.holds).toBe(false);
    // …but the CUSUM has passed H, the run's days rank below the baseline's, and Sen's line through the run stands ≥ 5 % down.
    expect(d.cusum!.signal).toBe(true);
    expect(d.cusum!.confirm!.test).toBe('rank_sum');
    expect(d.cusum!.confirm!.p).toBeLessThan(S.cusum.confirmAlpha);
    expect(d.cusum!.judgedNow!).toBeLessThanOrEqual(d.level - d.minChange);
    expect(d.path).toBe('cusum+rank_sum');
    expect(d.holds).toBe(true);
    // The same days with the fast path switched off: nothing yet.
    expect(detect(window, baseline, 'falling', series, { ...S, cusum: { ...S.cusum, enabled: false } }, { from: '2026-05-01', to: '2026-05-30' })!.holds).toBe(false);
  });

  it('does not open on one outlying day: the CUSUM passes H, the rank-sum test does not confirm', () => {
    const window = days('2026-05-01', Array.from({ length: 30 }, (_, i) => 1.7 * (1 + wobble(i + 30)) * (i === 29 ? 0.7 : 1)));
    const d = detect(window, baseline, 'falling', series, S, { from: '2026-05-01', to: '2026-05-30' })!;
    expect(d.cusum!.signal).toBe(true);
    expect(d.cusum!.confirm!.p).toBeGreaterThan(S.cusum.confirmAlpha);
    expect(d.holds).toBe(false);
    // Nor does it hold an open flag: no method finds degradation in one day.
    expect(d.either).toBe(false);
  });

  it('takes the fast path against a known healthy level without a baseline (p95_norm), not against a short baseline', () => {
    const p95 = { ...series, minRelativeChange: 0.15, logScale: true };
    // ln p95_norm: 12 days at the healthy level 0 (±2 %), then 4 %/day for 6 days.
    const logs = Array.from({ length: 18 }, (_, i) => Math.log1p(wobble(i) * 2 + 0.04 * Math.max(0, i - 11)));
    const window = days('2026-05-01', logs);
    const d = detect(window, [], 'rising', p95, S, { from: '2026-05-01', to: '2026-05-18' }, 'log', 0)!;
    expect(d.cusum!.target).toBe(0);
    expect(d.path).toBe('cusum+mann_kendall');
    // The same days against a 12-day baseline of its own (below cusum.minBaselineDays): no fast path.
    const short = days('2026-04-19', Array.from({ length: 12 }, (_, i) => Math.log1p(wobble(i + 40) * 2)));
    expect(detect(window, short, 'rising', p95, S, { from: '2026-05-01', to: '2026-05-18' }, 'log', 0)!.cusum).toBeNull();
  });

  // Sen's line: slope = median pairwise slope, intercept = median of x − slope·t (constructed, no source).
  it("reads Sen's line at the last day", () => {
    expect(lineEnd([0, 1, 2, 3], [1, 2, 3, 4])).toBeCloseTo(4, 12);
    // One wild point moves neither the median slope nor the median intercept much.
    expect(lineEnd([0, 1, 2, 3, 4], [0, 1, 20, 3, 4])).toBeCloseTo(4, 12);
  });

  it('does not open on a statistically clear drift smaller than the minimum change', () => {
    const window = days('2026-05-01', Array.from({ length: 30 }, (_, i) => 1.7 * (1 - 0.0005 * i)));
    const d = detect(window, baseline, 'falling', series, S, { from: '2026-05-01', to: '2026-05-30' })!;
    expect(d.trend!.mk.pDecreasing).toBeLessThan(0.001);
    expect(d.holds).toBe(false);
  });

  it('needs minDays in the window, and charts no EWMA without a baseline or a healthy level', () => {
    expect(detect(days('2026-05-01', [1, 2, 3]), baseline, 'rising', series, S, { from: '2026-05-01', to: '2026-05-03' })).toBeNull();
    const d = detect(days('2026-05-01', Array.from({ length: 12 }, (_, i) => 1 + i)), [], 'rising', series, S, { from: '2026-05-01', to: '2026-05-12' })!;
    expect(d.ewma).toBeNull();
    expect(d.holds).toBe(false);
    expect(detect(days('2026-05-01', Array.from({ length: 12 }, (_, i) => 1 + i)), [], 'rising', series, S, { from: '2026-05-01', to: '2026-05-12' }, 'linear', 1)!.ewma).not.toBeNull();
  });

  it('reads a relative minimum change as the same change on the log scale', () => {
    expect(minimumChange({ minRelativeChange: 0.1, minAbsoluteChange: 0 }, 0, 1, 'log')).toBeCloseTo(Math.log(1.1), 12);
    expect(minimumChange({ minRelativeChange: 0.1, minAbsoluteChange: 0 }, 0, -1, 'log')).toBeCloseTo(-Math.log(0.9), 12);
    expect(minimumChange({ minRelativeChange: 0.5, minAbsoluteChange: 2 }, 1, 1, 'linear')).toBe(2);
  });

  // Source: the individuals chart's σ̂ = MR̄/d2 with d2 = 1.128 (NIST/SEMATECH e-Handbook §6.3.2.2).
  it('estimates σ from moving ranges as MR̄/1.128', () => {
    expect(movingRangeSigma([1, 3, 2, 4])).toBeCloseTo((2 + 1 + 2) / 3 / 1.128, 12);
  });
});
