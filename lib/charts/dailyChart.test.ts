import { describe, expect, it } from 'vitest';
import { dailyChart, gapNote, pivotByUnit, unitKey } from './dailyChart';

const rows = [
  { day: '2026-12-01', a: 1, b: 10 },
  { day: '2026-12-03', a: 0, b: null },
];

describe('dailyChart', () => {
  const chart = dailyChart({
    id: 't',
    title: 'Test',
    timeZone: 'Europe/Oslo',
    from: '2026-11-30',
    to: '2026-12-03',
    rows,
    series: [
      { key: 'a', label: 'A', kind: 'line', tone: 'primary', unit: 'm', pick: (r) => r.a },
      { key: 'b', label: 'B', kind: 'bar', tone: 'secondary', unit: 'h', axis: 'right', pick: (r) => r.b },
    ],
    leftLabel: 'Alpha (m)',
    rightLabel: 'Beta (h)',
    refLines: [{ y: 5, label: 'Limit 5 m', tone: 'warning' }],
    about: 'About.',
  });

  it('has one row per day of the range, with null for days without a row', () => {
    expect(chart.rows).toEqual([
      { day: '2026-11-30', a: null, b: null },
      { day: '2026-12-01', a: 1, b: 10 },
      { day: '2026-12-02', a: null, b: null },
      { day: '2026-12-03', a: 0, b: null },
    ]);
    // A stored 0 stays 0: only missing days are gaps.
    expect(chart.rows[3]!.a).toBe(0);
  });

  it('counts the days with figures and says the rest are gaps', () => {
    expect(chart.days).toBe(4);
    expect(chart.daysWithData).toBe(2);
    expect(chart.note).toBe('About. 2 of 4 days have no figures: shown as gaps, not zeros.');
  });

  it('labels the day axis with the fleet zone and sizes each value axis', () => {
    expect(chart.xLabel).toBe('Fleet day (Europe/Oslo)');
    expect(chart.left).toEqual({ label: 'Alpha (m)', domain: [0, 6] });
    expect(chart.right).toEqual({ label: 'Beta (h)', domain: [0, 12] });
  });

  it('refuses a right-axis series without a right-axis label', () => {
    expect(() =>
      dailyChart({
        id: 'x',
        title: 'X',
        timeZone: 'UTC',
        from: '2026-12-01',
        to: '2026-12-01',
        rows,
        series: [{ key: 'b', label: 'B', kind: 'bar', tone: 'primary', unit: 'h', axis: 'right', pick: (r) => r.b }],
        leftLabel: 'Alpha (m)',
        about: '',
      }),
    ).toThrow(/rightLabel/);
  });
});

describe('gapNote', () => {
  it.each([
    [30, 30, 'Figures on all 30 days.'],
    [30, 0, 'No figures on any of the 30 days.'],
    [30, 29, '1 of 30 days have no figures: shown as gaps, not zeros.'],
  ])('%i days, %i with data', (days, withData, text) => expect(gapNote(days, withData)).toBe(text));
});

describe('pivotByUnit', () => {
  it('makes a column per unit in natural order, keyed so a unit called "day" cannot clash', () => {
    const { units, rows: pivoted } = pivotByUnit(
      [
        { day: '2026-12-01', unit: 'T10', v: 1 },
        { day: '2026-12-01', unit: 'T2', v: 2 },
        { day: '2026-12-02', unit: 'day', v: null },
      ],
      (r) => r.unit,
      (r) => r.v,
    );
    expect(units).toEqual(['day', 'T2', 'T10']);
    expect(pivoted).toEqual([
      { day: '2026-12-01', [unitKey('T10')]: 1, [unitKey('T2')]: 2 },
      { day: '2026-12-02', [unitKey('day')]: null },
    ]);
  });
});
