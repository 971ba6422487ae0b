import { describe, expect, it } from 'vitest';
import { DEFAULT_FLAG_SETTINGS } from './config';
import { detect, minimumChange, movingRangeSigma } from './detect';
import { addDays } from '../time/fleetDay';

const S = DEFAULT_FLAG_SETTINGS;
const series = { enabled: true, minRelativeChange: 0.05, minAbsoluteChange: 0, weatherAdjust: false, logScale: false, maxBaselineScatter: null };
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
