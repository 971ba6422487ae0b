import { describe, expect, it } from 'vitest';
import { efficiencyIndex, idealPowerW, idealThrustCoefficient, idealThrustN } from './efficiency';

// Source: docs spec metrics-v1: efficiency_index = Σ(thrust_kn·run_s)/Σ(power_kw^(2/3)·run_s)
// over intervals with run_s > 0 and power_kw > 0.
describe('efficiencyIndex', () => {
  it('weights by run time: (100·60 + 200·30) / (1000^(2/3)·60 + 8000^(2/3)·30) = 12000/18000', () => {
    // 1000^(2/3) = 100, 8000^(2/3) = 400
    const idx = efficiencyIndex([
      { run_s: 60, thrust_kn: 100, power_kw: 1000 },
      { run_s: 30, thrust_kn: 200, power_kw: 8000 },
      { run_s: 0, thrust_kn: 0, power_kw: 0 }, // stopped
      { run_s: 60, thrust_kn: 50, power_kw: 0 }, // no power: excluded
      { run_s: 60, power_kw: 500 }, // no thrust: excluded
    ]);
    expect(idx).toBeCloseTo(2 / 3, 12);
  });
  it('is null with no running intervals', () => {
    expect(efficiencyIndex([])).toBeNull();
    expect(efficiencyIndex([{ run_s: 0 }, { run_s: 0, thrust_kn: 0, power_kw: 0 }])).toBeNull();
  });
});

// Ideal momentum theory (derivation in efficiency.ts): P = sqrt(T³/(2ρA)), T = (2ρA·P²)^(1/3);
// with ρ = 1025 kg/m³, T[kN] = 1.1721·(D[m]·P[kW])^(2/3).
describe('ideal momentum theory', () => {
  it('coefficient 0.1·(1025π/2)^(1/3) = 1.1721', () => {
    expect(idealThrustCoefficient()).toBeCloseTo(1.1721, 4);
    expect(idealThrustCoefficient()).toBeCloseTo(1.172055, 6); // 0.1·cbrt(1610.066…)
  });
  it('the SI form and the kN/kW form agree (D = 3 m, P = 1000 kW → ≈ 243.8 kN)', () => {
    const tKn = idealThrustN(1000e3, 3) / 1000;
    expect(tKn).toBeCloseTo(idealThrustCoefficient() * (3 * 1000) ** (2 / 3), 9);
    expect(tKn).toBeCloseTo(1.1721 * 3000 ** (2 / 3), 0);
  });
  it('P = sqrt(T³/(2ρA)) inverts T = (2ρA·P²)^(1/3)', () => {
    expect(idealPowerW(idealThrustN(2.5e6, 4), 4)).toBeCloseTo(2.5e6, 3);
    // direct: T = 100 kN, D = 2 m: P = sqrt(1e15 / (2·1025·π)) W
    expect(idealPowerW(1e5, 2)).toBeCloseTo(Math.sqrt(1e15 / (2 * 1025 * Math.PI)), 3);
  });
});
