import { describe, expect, it } from 'vitest';
import { addDays } from '../../time/fleetDay';
import { affectedRange, normalisedDays, type StoredDay } from './normalisation';

/**
 * Synthetic vessel history where the answer is known: p95 = 0.4 + 0.02·W²
 * exactly (a made-up calm floor and wind slope), wind varying day to day.
 * A day whose p95 is 1.5× what its weather explains must read 1.5.
 */
const START = '2026-01-01';
const wind = (i: number) => 3 + ((i * 7) % 13);
const truth = (w: number) => 0.4 + 0.02 * w * w;

function history(days: number, edit: (d: StoredDay, i: number) => StoredDay = (d) => d): StoredDay[] {
  return Array.from({ length: days }, (_, i) =>
    edit({ day: addDays(START, i), p95_m: truth(wind(i)), p95_overflow: false, wind_mean_ms: wind(i), current_mean_ms: null }, i),
  );
}

describe('normalisedDays (p95_norm over a sliding baseline)', () => {
  it('reads 1 on days that follow the fitted weather law and 1.5 on a day 1.5× worse', () => {
    const days = history(200, (d, i) => (i === 180 ? { ...d, p95_m: 1.5 * d.p95_m! } : d));
    const norms = normalisedDays(days, addDays(START, 150), addDays(START, 199));
    expect(norms.size).toBe(50);
    for (const [day, v] of norms) {
      if (day === addDays(START, 180)) expect(v).toBeCloseTo(1.5, 9);
      else expect(v).toBeCloseTo(1, 9);
    }
  });

  it('needs 20 baseline days: null before, a value from the first day that has them', () => {
    // Day i's baseline is days i−119 … i−30, so day 49 has baseline days 0…19.
    const norms = normalisedDays(history(60), START, addDays(START, 59));
    expect(norms.get(addDays(START, 48))).toBeNull();
    expect(norms.get(addDays(START, 49))).toBeCloseTo(1, 9);
  });

  it('leaves censored (≥ 10 m) and weatherless days out of the baseline', () => {
    const days = history(200, (d, i) =>
      i % 10 === 3 ? { ...d, p95_m: 10, p95_overflow: true } : i % 10 === 7 ? { ...d, p95_m: 9, wind_mean_ms: null } : d,
    );
    for (const [day, v] of normalisedDays(days, addDays(START, 150), addDays(START, 199))) {
      const i = days.findIndex((d) => d.day === day);
      if (i % 10 === 7) expect(v).toBeNull(); // no weather: nothing to normalise against
      else if (i % 10 !== 3) expect(v).toBeCloseTo(1, 9);
    }
  });
});

describe('affectedRange', () => {
  it('re-evaluates the changed days and the 119 days after (their baselines hold them), reading 119 days before', () => {
    expect(affectedRange('2026-06-10', '2026-06-12')).toEqual({
      evaluateFrom: '2026-06-10',
      evaluateTo: addDays('2026-06-12', 119),
      readFrom: addDays('2026-06-10', -119),
    });
  });
});
