import { describe, expect, it } from 'vitest';
import { median, refFigures } from './refs';

// Source: docs spec metrics-v1 "Reference systems".
describe('refFigures', () => {
  const records = [
    { systems: [{ id: 'G1', online_s: 60, weight: 0.5, sd_m: 0.2, rejected: 0 }, { id: 'H1', online_s: 0, sd_m: 9, rejected: 2 }] },
    { systems: [{ id: 'G1', online_s: 30, weight: 0.8, sd_m: 0.4, rejected: 1 }] },
    { systems: [{ id: 'G1', online_s: 0, weight: 0.1, sd_m: 5 }] },
    { systems: [{ id: 'G1', online_s: 90, weight: 0.2, sd_m: 0.3 }] },
  ];
  it('online hours, online-weighted weight, median sd over online intervals, rejections', () => {
    const f = refFigures(records, 'G1');
    expect(f.online_hours).toBeCloseTo(180 / 3600, 12);
    // (60·0.5 + 30·0.8 + 0·0.1 + 90·0.2) / 180 = 72/180 = 0.4
    expect(f.weight_mean).toBeCloseTo(0.4, 12);
    expect(f.sd_m_median).toBeCloseTo(0.3, 12); // of 0.2, 0.4, 0.3 (the offline 5 is left out)
    expect(f.rejections).toBe(1);
  });
  it('an offline system: 0 online hours, no weight or median', () => {
    expect(refFigures(records, 'H1')).toEqual({ online_hours: 0, weight_mean: null, sd_m_median: null, rejections: 2 });
    expect(refFigures(records, 'X')).toEqual({ online_hours: null, weight_mean: null, sd_m_median: null, rejections: null });
  });
});

describe('median', () => {
  it('middle value, or the mean of the two middle values', () => {
    expect(median([3, 1, 2])).toBe(2);
    expect(median([4, 1, 3, 2])).toBe(2.5);
    expect(median([])).toBeNull();
  });
});
