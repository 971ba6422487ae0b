import { describe, expect, it } from 'vitest';
import { addDays } from '../time/fleetDay';
import { adjustForWeather, fitWeather, withinBaselineWeather } from './weather';

describe('weather adjustment (regression adjustment on W², Hawkins 1993)', () => {
  const days = Array.from({ length: 30 }, (_, i) => addDays('2026-05-01', i));
  const wind = new Map(days.map((d, i) => [d, 4 + ((i * 7) % 11)]));

  it('removes a pure wind effect exactly, keeping the baseline level (constructed, no source)', () => {
    // y = 2 + 0.01·W²: the adjusted series is flat at the baseline mean of y.
    const values = days.map((day) => ({ day, value: 2 + 0.01 * wind.get(day)! ** 2 }));
    const fit = fitWeather(values.slice(0, 20), wind, 10)!;
    expect(fit.beta1).toBeCloseTo(0.01, 9);
    const adjusted = adjustForWeather(values, wind, fit);
    const baselineMean = values.slice(0, 20).reduce((s, v) => s + v.value, 0) / 20;
    for (const a of adjusted) expect(a.value).toBeCloseTo(baselineMean, 9);
  });

  it('keeps a trend the baseline never saw', () => {
    const values = days.map((day, i) => ({ day, value: 2 + 0.01 * wind.get(day)! ** 2 + (i >= 20 ? 0.05 * (i - 19) : 0) }));
    const fit = fitWeather(values.slice(0, 20), wind, 10)!;
    const adjusted = adjustForWeather(values, wind, fit);
    expect(adjusted[29]!.value - adjusted[19]!.value).toBeCloseTo(0.5, 6);
  });

  it('needs enough baseline days with wind, and leaves out days without it', () => {
    const values = days.map((day) => ({ day, value: 1 }));
    expect(fitWeather(values.slice(0, 9), wind, 10)).toBeNull();
    const fit = fitWeather(values.slice(0, 20), wind, 10)!;
    const partial = new Map([...wind].slice(0, 25));
    expect(adjustForWeather(values, partial, fit)).toHaveLength(25);
  });

  describe('judging only weather the baseline has seen', () => {
    const baseline = days.slice(0, 20).map((day) => ({ day, value: 1 }));
    const window = days.slice(20).map((day) => ({ day, value: 1 }));
    // Baseline winds 4 … 14 m/s (i·7 mod 11); the window's get 10, 14, 15.4, 15.5, 20 m/s and one has no wind figure.
    const windows = new Map(wind);
    [10, 14, 15.4, 15.5, 20].forEach((w, i) => windows.set(window[i]!.day, w));
    windows.delete(window[5]!.day);

    it("leaves out the days windier than the baseline's windiest day × (1 + margin), keeps those without wind", () => {
      const r = withinBaselineWeather(window, baseline, windows, 0.1, 10)!;
      expect(r.range.maxWindMs).toBeCloseTo(14 * 1.1, 9);
      expect(r.range.leftOut).toBe(2);
      expect(r.window.map((d) => d.day)).not.toContain(window[3]!.day);
      expect(r.window.map((d) => d.day)).not.toContain(window[4]!.day);
      expect(r.window.map((d) => d.day)).toContain(window[2]!.day);
      expect(r.window.map((d) => d.day)).toContain(window[5]!.day);
    });

    it('knows no range without enough baseline days with wind', () => {
      expect(withinBaselineWeather(window, baseline.slice(0, 9), windows, 0.1, 10)).toBeNull();
    });

    it('keeps a healthy figure that grows faster than W² in a blow from looking worn (constructed, no source)', () => {
      // y = 0.1 + 0.0005·W³: the W² fit on calm days under-predicts a gale, so the adjusted gale days stand out.
      const cubic = (w: number) => 0.1 + 0.0005 * w ** 3;
      const calm = days.slice(0, 20).map((day) => ({ day, value: cubic(wind.get(day)!) }));
      const gale = days.slice(20).map((day, i) => ({ day, value: cubic(20 + i) }));
      const galeWind = new Map([...wind, ...gale.map((d, i) => [d.day, 20 + i] as const)]);
      const fit = fitWeather(calm, galeWind, 10)!;
      const adjusted = adjustForWeather(gale, galeWind, fit);
      const level = calm.reduce((s, d) => s + d.value, 0) / calm.length;
      expect(Math.min(...adjusted.map((d) => d.value))).toBeGreaterThan(level * 1.5);
      expect(withinBaselineWeather(adjusted, calm, galeWind, 0.1, 10)!.window).toEqual([]);
    });
  });

  describe("with the wind's beam share as a second regressor", () => {
    // Beam shares that do not follow the wind speed: 0.1 … 0.55.
    const beam = new Map(days.map((d, i) => [d, 0.1 + 0.05 * ((i * 5) % 10)]));

    it('removes a heading figure driven by the angle off the bow as well as the speed (constructed, no source)', () => {
      // y = 0.05 + 0.0002·W² + 0.2·B: the wind-speed fit alone leaves the beam's share in; both leave none.
      const values = days.map((day) => ({ day, value: 0.05 + 0.0002 * wind.get(day)! ** 2 + 0.2 * beam.get(day)! }));
      const both = fitWeather(values.slice(0, 20), wind, 10, beam)!;
      expect(both.beta2).toBeCloseTo(0.2, 9);
      expect(both.beta1).toBeCloseTo(0.0002, 9);
      const flat = adjustForWeather(values, wind, both, beam).map((d) => d.value);
      expect(Math.max(...flat) - Math.min(...flat)).toBeLessThan(1e-9);
      const speedOnly = fitWeather(values.slice(0, 20), wind, 10)!;
      const left = adjustForWeather(values, wind, speedOnly).map((d) => d.value);
      expect(Math.max(...left) - Math.min(...left)).toBeGreaterThan(0.05);
    });

    it('falls back to the wind alone when the beam share hardly varies (a vessel heading into the wind)', () => {
      const steady = new Map(days.map((d) => [d, 0.02]));
      const values = days.map((day) => ({ day, value: 0.05 + 0.0002 * wind.get(day)! ** 2 }));
      const fit = fitWeather(values.slice(0, 20), wind, 10, steady)!;
      expect(fit.beta2).toBeNull();
      expect(fit.beta1).toBeCloseTo(0.0002, 9);
      expect(adjustForWeather(values, wind, fit, steady)).toHaveLength(30);
    });
  });
});
