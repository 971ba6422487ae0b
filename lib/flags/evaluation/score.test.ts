import { describe, expect, it } from 'vitest';
import { medianOf, scoreFlags, scoreLine, type TruthEntry } from './score';

// The scoring rules stated in score.ts (project's rules), on a hand-made case.
const truth: TruthEntry[] = [
  { scenario: 'thruster_fouling', vessel: 'a', subject: 'thruster:T1', metric: 'efficiency_index', onset_date: '2026-05-10', expect_flag: true },
  { scenario: 'reference_noise', vessel: 'b', subject: 'ref:G1', metric: 'sd_m_median', onset_date: '2026-05-10', expect_flag: true },
  { scenario: 'weather_only', vessel: 'c', subject: 'vessel', metric: 'p95_norm', onset_date: '2026-05-01', expect_flag: false },
  { scenario: 'link_outage', vessel: 'd', subject: 'vessel', metric: null, onset_date: '2026-05-05', expect_flag: false },
];

describe('scoreFlags', () => {
  it('counts correct flags, misses, early flags, other metrics and the weather control', () => {
    const s = scoreFlags(truth, [
      { vessel: 'a', subject: 'thruster:T1', metric: 'efficiency_index', opened_day: '2026-05-16' },
      { vessel: 'a', subject: 'thruster:T1', metric: 'efficiency_index', opened_day: '2026-05-20' },
      { vessel: 'b', subject: 'ref:G1', metric: 'sd_m_median', opened_day: '2026-05-09' },
      { vessel: 'a', subject: 'thruster:T2', metric: 'efficiency_index', opened_day: '2026-05-16' },
      { vessel: 'c', subject: 'vessel', metric: 'hdg_rms', opened_day: '2026-05-16' },
    ]);
    expect(s.flags).toBe(5);
    // Both flags of a's T1 after onset are correct; b's came before its onset.
    expect(s.correct).toBe(2);
    expect(s.precision).toBeCloseTo(0.4, 12);
    expect(s.recall).toBe(0.5);
    expect(s.perEntry[0]!.delayDays).toBe(6);
    expect(s.medianDetectDays).toBe(6);
    expect(s.weatherFalseFlags).toBe(1);
    expect(scoreLine(s)).toBe('precision=0.400 recall=0.500 median_detect_days=6 weather_false_flags=1');
  });

  it('gives precision 1 with no flag, recall 0, and no median', () => {
    const s = scoreFlags(truth, []);
    expect([s.precision, s.recall, s.medianDetectDays]).toEqual([1, 0, null]);
    expect(medianOf([3, 1, 2, 10])).toBe(2.5);
  });

  it('counts a flag on a consequence of a fault as right after onset, without requiring it', () => {
    const withConsequence: TruthEntry[] = [
      ...truth,
      { scenario: 'generator_derate', vessel: 'e', subject: 'vessel', metric: 'limit_events_per_dp_day', onset_date: '2026-05-10', expect_flag: true },
      { scenario: 'generator_derate', vessel: 'e', subject: 'vessel', metric: 'p95_norm', onset_date: '2026-05-10', expect_flag: false, consequence: true },
    ];
    const s = scoreFlags(withConsequence, [
      { vessel: 'e', subject: 'vessel', metric: 'limit_events_per_dp_day', opened_day: '2026-05-12' },
      { vessel: 'e', subject: 'vessel', metric: 'p95_norm', opened_day: '2026-05-20' },
      { vessel: 'e', subject: 'vessel', metric: 'p95_norm', opened_day: '2026-05-01' },
      { vessel: 'e', subject: 'vessel', metric: 'hdg_rms', opened_day: '2026-05-20' },
    ]);
    // Right: the limit events and p95_norm after onset; false: p95_norm before onset, and hdg_rms (not listed).
    expect(s.correct).toBe(2);
    expect(s.consequential).toEqual([{ vessel: 'e', subject: 'vessel', metric: 'p95_norm', opened_day: '2026-05-20' }]);
    expect(s.falseFlags.map((f) => `${f.metric} ${f.opened_day}`)).toEqual(['p95_norm 2026-05-01', 'hdg_rms 2026-05-20']);
    // Not required: recall and the delay are over the expected entries only.
    expect(s.expected).toBe(3);
    expect(s.detected).toBe(1);
    expect(s.medianDetectDays).toBe(2);
  });
});
