import { describe, expect, it } from 'vitest';
import { flagPoints, healthScore, isThrusterDue, limitRate, scoreBand, SCORE_COMPONENTS } from './healthScore';

const calm = { p95NormMedian: 1, dpHours: 240, limitEvents: 0, openFlags: {}, thrusters: 4, thrustersDue: 0 };

describe('healthScore', () => {
  it('weights add up to 100', () => {
    expect(SCORE_COMPONENTS.reduce((s, c) => s + c.weight, 0)).toBe(100);
  });

  it('is 100 for a vessel with nothing against it', () => {
    expect(healthScore(calm)).toMatchObject({ score: 100, partial: false });
  });

  it('loses each component linearly between its thresholds', () => {
    // Accuracy median 1.25 (half-way from 1.0 to 1.5): −20; 2 events per DP day (half of 4): −10;
    // one warning flag (2 of 6 points): −25/3; one thruster due (half of 2): −7.5. 100 − 45.83 = 54.17.
    const s = healthScore({ ...calm, p95NormMedian: 1.25, limitEvents: 20, openFlags: { warning: 1 }, thrustersDue: 1 });
    const expected = [
      ['accuracy', 1.25, 20],
      ['power', 2, 10],
      ['flags', 2, 25 / 3],
      ['service', 1, 7.5],
    ] as const;
    expected.forEach(([key, value, lost], i) => {
      const c = s.components[i]!;
      expect(c.key).toBe(key);
      expect(c.value).toBeCloseTo(value, 12);
      expect(c.lost).toBeCloseTo(lost, 12);
    });
    expect(s.score).toBe(54);
  });

  it('caps every component at its weight', () => {
    const s = healthScore({ ...calm, p95NormMedian: 3, limitEvents: 1000, openFlags: { alarm: 5 }, thrustersDue: 4 });
    expect(s.score).toBe(0);
  });

  it('leaves out what cannot be computed and rescales the rest, marking the score partial', () => {
    // No weather fit yet (no p95_norm) and no thrusters: power 20 + flags 25 remain; 2 events/DP day loses 10 of 45.
    const s = healthScore({ ...calm, p95NormMedian: null, limitEvents: 20, thrusters: 0 });
    expect(s.partial).toBe(true);
    expect(s.components.find((c) => c.key === 'accuracy')!.lost).toBeNull();
    expect(s.score).toBe(Math.round(100 * (1 - 10 / 45)));
  });

  it('has no score without DP time, whatever the flags say', () => {
    const s = healthScore({ ...calm, p95NormMedian: null, dpHours: 0, limitEvents: 3, openFlags: { alarm: 2 } });
    expect(s.score).toBeNull();
  });
});

describe('parts of the score', () => {
  it('limit rate is per 24 DP hours and undefined without DP time', () => {
    expect(limitRate(6, 36)).toBe(4);
    expect(limitRate(6, 0)).toBeNull();
    expect(limitRate(null, 10)).toBeNull();
  });

  it('flag points by severity', () => {
    expect(flagPoints({ alarm: 1, warning: 2, advisory: 3 })).toBe(10);
  });

  it('a thruster is due near the end of its interval or soon at its current rate', () => {
    expect(isThrusterDue(1_900, 20_000, null)).toBe(true); // 9.5 % left
    expect(isThrusterDue(5_000, 20_000, 200)).toBe(true); // 25 days at 200 h/day
    expect(isThrusterDue(5_000, 20_000, 100)).toBe(false); // 50 days
    expect(isThrusterDue(-10, 20_000, 0)).toBe(true); // overdue
  });

  it('bands in words', () => {
    expect([scoreBand(95), scoreBand(80), scoreBand(79), scoreBand(59), scoreBand(null)]).toEqual([
      'steady',
      'steady',
      'watch',
      'attention',
      'none',
    ]);
  });
});
