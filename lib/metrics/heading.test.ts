import { describe, expect, it } from 'vitest';
import { dpHours, isDpInterval } from './dpIntervals';
import { headingFigures } from './heading';

// Source: docs spec metrics-v1: hdg_rms = sqrt(Σ n·rms²/Σ n), hdg_max_abs = max;
// DP intervals are station intervals with mode auto_position; dp_hours = Σ dp_s/3600.
describe('headingFigures', () => {
  it('merges RMS by samples and takes the largest |error|', () => {
    const f = headingFigures([
      { n: 60, hdg_err: { rms: 0.5, max_abs: 1.2 } },
      { n: 20, hdg_err: { rms: 1.5, max_abs: 2.5 } },
      { n: 60, hdg_err: undefined },
    ]);
    // sqrt((60·0.25 + 20·2.25)/80) = sqrt(60/80) = sqrt(0.75)
    expect(f.hdg_rms).toBeCloseTo(Math.sqrt(0.75), 12);
    expect(f.hdg_max_abs).toBe(2.5);
  });

  it('is null when no interval sent heading error', () => {
    expect(headingFigures([{ n: 60, hdg_err: undefined }])).toEqual({ hdg_rms: null, hdg_max_abs: null });
    expect(headingFigures([])).toEqual({ hdg_rms: null, hdg_max_abs: null });
  });
});

describe('DP intervals', () => {
  it('selects auto_position only; dp_hours sums dp_s of every interval', () => {
    expect(isDpInterval({ mode: 'auto_position' })).toBe(true);
    expect(isDpInterval({ mode: 'auto_track' })).toBe(false);
    expect(dpHours([{ dp_s: 3600 }, { dp_s: 1800 }, { dp_s: 0 }])).toBe(1.5);
    expect(dpHours([])).toBe(0);
  });
});
