import { describe, expect, it } from 'vitest';
import { firstDayAfterClose, nextStep, type LiveFlag } from './lifecycle';

// The lifecycle rules of metrics-v1 "Trend flags" as lifecycle.ts states them (project's rules).
const live: LiveFlag = { id: 7, severity: 'warning', clearDays: 0, lastEvaluatedDay: '2026-05-10', closeProposedDay: null };

describe('flag lifecycle steps', () => {
  it('opens only when the opening condition holds and no flag is live', () => {
    expect(nextStep(null, '2026-05-11', true, true, 'advisory', 7)).toEqual({ kind: 'open', severity: 'advisory' });
    expect(nextStep(null, '2026-05-11', false, true, null, 7)).toEqual({ kind: 'none' });
  });

  it('does nothing for a day already evaluated (re-runs, late re-evaluation)', () => {
    expect(nextStep(live, '2026-05-10', true, true, 'alarm', 7)).toEqual({ kind: 'none' });
    expect(nextStep(live, '2026-05-01', false, false, null, 7)).toEqual({ kind: 'none' });
  });

  it('escalates, never calms, and resets the clear count while either method still sees it', () => {
    expect(nextStep({ ...live, clearDays: 3 }, '2026-05-11', true, true, 'alarm', 7)).toEqual({ kind: 'update', id: 7, severity: 'alarm', clearDays: 0, closeProposedDay: null });
    expect(nextStep(live, '2026-05-11', true, true, 'advisory', 7)).toMatchObject({ severity: 'warning' });
    expect(nextStep({ ...live, clearDays: 3, closeProposedDay: '2026-05-09' }, '2026-05-11', false, true, null, 7)).toMatchObject({ clearDays: 0, closeProposedDay: null });
  });

  it('counts clear days and proposes closing on the day the count reaches the setting', () => {
    expect(nextStep({ ...live, clearDays: 5 }, '2026-05-11', false, false, null, 7)).toMatchObject({ clearDays: 6, closeProposedDay: null });
    expect(nextStep({ ...live, clearDays: 6 }, '2026-05-11', false, false, null, 7)).toMatchObject({ clearDays: 7, closeProposedDay: '2026-05-11' });
    expect(nextStep({ ...live, clearDays: 7, closeProposedDay: '2026-05-11' }, '2026-05-12', false, false, null, 7)).toMatchObject({ clearDays: 8, closeProposedDay: '2026-05-11' });
  });

  it('judges a series only from the day after its last flag closed', () => {
    expect(firstDayAfterClose('2026-05-01', null)).toBe('2026-05-01');
    expect(firstDayAfterClose('2026-05-01', '2026-05-10')).toBe('2026-05-11');
    expect(firstDayAfterClose('2026-05-20', '2026-05-10')).toBe('2026-05-20');
  });
});
