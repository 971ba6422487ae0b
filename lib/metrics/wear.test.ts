import { describe, expect, it } from 'vitest';
import { ROLLER_LIFE_EXPONENT, intervalWearHours, l10Hours, l10MillionRevolutions, sumWearHours, wearHoursOfBands } from './wear';

const band = (b: number, seconds: number) => {
  const bands = new Array<number>(11).fill(0);
  bands[b] = seconds;
  return bands;
};

// Source: docs spec metrics-v1 "Thruster wear": Σ load_band_s[b]/3600·(m_b/100)^p.
describe('wear hours', () => {
  it('1 h at the 95 % band with p = 3 is 0.95³ = 0.857375 h', () => {
    expect(wearHoursOfBands(band(9, 3600), { p: 3 })).toBeCloseTo(0.857375, 12);
  });
  it('1 h at the top band (≥ 100 %, m = 105 %) is 1.05³ = 1.157625 h', () => {
    expect(wearHoursOfBands(band(10, 3600))).toBeCloseTo(1.157625, 12);
  });
  it('sums bands: ½ h at 5 % and ½ h at 45 % → 0.5·(0.000125 + 0.091125) = 0.045625 h', () => {
    const bands = band(0, 1800);
    bands[4] = 1800;
    expect(wearHoursOfBands(bands)).toBeCloseTo(0.045625, 12);
  });
  it('uses the per-thruster exponent: 1 h at 95 % with p = 10/3 is 0.95^(10/3) ≈ 0.842840', () => {
    // 0.95^(10/3) = exp((10/3)·ln 0.95) = exp(−0.170977…) = 0.842840…
    expect(wearHoursOfBands(band(9, 3600), { p: ROLLER_LIFE_EXPONENT })).toBeCloseTo(0.842840, 6);
    expect(wearHoursOfBands(band(9, 3600), { p: ROLLER_LIFE_EXPONENT })).toBeLessThan(0.857375);
  });
  it('an idle floor makes unloaded running count: 1 h at 5 % with floor 0.1 → 0.1 h', () => {
    expect(wearHoursOfBands(band(0, 3600))).toBeCloseTo(0.000125, 12);
    expect(wearHoursOfBands(band(0, 3600), { idleFloor: 0.1 })).toBeCloseTo(0.1, 12);
    expect(wearHoursOfBands(band(9, 3600), { idleFloor: 0.1 })).toBeCloseTo(0.857375, 12); // above the floor
  });
  it('no bands: 0 when the unit did not run, null (unknown) when it did', () => {
    expect(intervalWearHours({ run_s: 0 })).toBe(0);
    expect(intervalWearHours({ run_s: 60 })).toBeNull();
    expect(intervalWearHours({ run_s: 0, load_band_s: new Array(11).fill(0) })).toBe(0);
  });
  it('a day sums known intervals and reports the run time without bands; null when nothing is known', () => {
    expect(sumWearHours([{ run_s: 3600, load_band_s: band(9, 3600) }, { run_s: 60 }, { run_s: 0 }])).toEqual({
      wear_hours: expect.closeTo(0.857375, 12),
      unbanded_run_s: 60,
    });
    expect(sumWearHours([{ run_s: 60 }])).toEqual({ wear_hours: null, unbanded_run_s: 60 });
    expect(sumWearHours([])).toEqual({ wear_hours: null, unbanded_run_s: 0 });
  });
  it('refuses malformed input', () => {
    expect(() => wearHoursOfBands([1, 2, 3])).toThrow(RangeError);
    expect(() => wearHoursOfBands(band(0, 1), { p: 0 })).toThrow(RangeError);
    expect(() => wearHoursOfBands(band(0, 1), { idleFloor: 2 })).toThrow(RangeError);
  });
});

// Source: ISO 281:2007 basic rating life L10 = (C/P)^p (10^6 revolutions),
// L10h = 10^6/(60·n)·L10. The worked numbers (C = 30 kN, P = 5 kN, 1500 rpm →
// 216 million revolutions, 2400 h; 392.5 million with p = 10/3) are as stated
// in the project issue, and follow by arithmetic: 6³ = 216,
// 10^6/(60·1500)·216 = 2400, 6^(10/3) = 216·6^(1/3) = 392.498…
describe('ISO 281 basic rating life', () => {
  it('C = 30 kN, P = 5 kN, p = 3: L10 = 216 million revolutions; at 1500 rpm L10h = 2400 h', () => {
    expect(l10MillionRevolutions(30, 5)).toBeCloseTo(216, 10);
    expect(l10Hours(30, 5, 1500)).toBeCloseTo(2400, 9);
  });
  it('p = 10/3 (roller bearings): 392.5 million revolutions', () => {
    expect(Math.abs(l10MillionRevolutions(30, 5, 10 / 3) - 392.5)).toBeLessThan(0.005);
  });
  it('refuses non-positive loads and speed', () => {
    expect(() => l10MillionRevolutions(30, 0)).toThrow(RangeError);
    expect(() => l10Hours(30, 5, 0)).toThrow(RangeError);
  });
});
