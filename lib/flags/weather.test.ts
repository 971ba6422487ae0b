import { describe, expect, it } from 'vitest';
import { addDays } from '../time/fleetDay';
import { adjustForWeather, fitWeather } from './weather';

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
});
