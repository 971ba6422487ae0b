import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readFleetFile } from '../../lib/register/fleetFile';
import { positionErrorStats } from '../intervalStatistics';
import { demoSite } from '../sites';
import { Allocator, thrustForce } from './allocation';
import { DEG, KN_PER_TONNE, RHO_WATER } from './constants';
import { Pid, proportionalDemandT } from './controller';
import { waveDriftForce, windForce } from './environment';
import { AxisFilter, correct } from './estimator';
import { SimRandom } from './fastNormal';
import { powerLimitScale } from './power';
import { inverseVarianceWeights } from './references';
import { CPP_IDLE, FPP_IDLE, idealThrust, THRUST_EFFICIENCY, ThrusterBank, thrusterLayout } from './thrusters';
import { vesselModel } from './vesselModel';
import { VesselSimulator } from './vesselSimulator';
import type { FleetVessel } from '../../lib/register/fleetFile';

/** p-quantile of the radial error from a 0.1 m histogram, interpolating within the bin. */
function histQuantile(hist: readonly number[], q: number): number {
  const n = hist.reduce((a, b) => a + b, 0);
  const target = q * n;
  let cum = 0;
  for (let k = 0; k < hist.length; k++) {
    const c = hist[k]!;
    if (cum + c >= target) return 0.1 * (k + (target - cum) / c);
    cum += c;
  }
  return 10;
}

// Rayleigh distribution (radial error of an isotropic 2-D Gaussian, per-axis σ):
// median = σ √(2 ln 2) = 1.1774 σ, p95 = σ √(2 ln 20) = 2.4477 σ (standard result).
const RAYLEIGH_MEDIAN = Math.sqrt(2 * Math.LN2);
const RAYLEIGH_P95 = Math.sqrt(2 * Math.log(20));

describe('units and rules of thumb', () => {
  it('1 t = 9.80665 kN (standard gravity, CGPM 1901)', () => {
    expect(KN_PER_TONNE).toBe(9.80665);
    expect((1000 * 9.80665) / 1000).toBeCloseTo(KN_PER_TONNE, 12);
  });

  it('estimator correction = gain × residual: gain 0.5, 1 m residual → 0.5 m (common practice, no source)', () => {
    expect(correct(10, 11, 0.5) - 10).toBeCloseTo(0.5, 12);
    // The Kalman filter itself: with prior variance equal to the measurement variance the gain is 0.5.
    const kf = new AxisFilter(0, 0, 0.04);
    kf.update(1, 0.04);
    expect(kf.gain).toBeCloseTo(0.5, 12);
    expect(kf.p).toBeCloseTo(0.5, 12);
  });

  it('position gain 4 t/m on a 0.5 m error → 2 t demand, opposing the error (common practice, no source)', () => {
    expect(proportionalDemandT(4, 0.5)).toBeCloseTo(-2, 12);
    const kp = 4 * 1000 * KN_PER_TONNE; // N/m
    const pid = new Pid({ kp, kd: 0, ki: 0, iMax: Infinity });
    expect(pid.kpTonnesPerMetre).toBeCloseTo(4, 12);
    expect(pid.demand(0.5, 0, 1) / 1000).toBeCloseTo(-2 * 9.80665, 9); // kN
  });

  it('a reference with higher variance gets lower weight: inverse-variance weighting (minimum-variance combination; Sørensen 2011 §3.2)', () => {
    const w = inverseVarianceWeights([0.1 ** 2, 0.5 ** 2, 0.2 ** 2]);
    expect(w[0]!).toBeGreaterThan(w[2]!);
    expect(w[2]!).toBeGreaterThan(w[1]!);
    expect(w[0]! + w[1]! + w[2]!).toBeCloseTo(1, 12);
    // w_i ∝ 1/σ_i²: 100 : 4 : 25.
    expect(w[0]! / w[1]!).toBeCloseTo(25, 9);
    expect(w[0]! / w[2]!).toBeCloseTo(4, 9);
    expect(inverseVarianceWeights([0.04, 0])[1]).toBe(0); // absent system
  });
});

describe('ideal momentum theory and propeller laws', () => {
  it('T = (2ρAP²)^(1/3) for a given power and disc area (actuator disc: T = 2ρA v², P = T v)', () => {
    const P = 1e6, D = 2, A = (Math.PI * D * D) / 4;
    const T = idealThrust(P, A);
    // Independent check from the actuator-disc relations: v = P/T at the disc, T = 2ρA v².
    const v = P / T;
    expect(2 * RHO_WATER * A * v * v).toBeCloseTo(T, 3);
    expect(T / 1000).toBeCloseTo(186.1, 0); // ≈ 186 kN for 1 MW on a 2 m disc
  });

  it('thrusters: rated thrust is the derated ideal thrust, T ∝ n², P ∝ n³ (affinity laws), consistent at part load', () => {
    // A fixed-pitch azimuth (variable speed) and a controllable-pitch tunnel (constant speed, pitch varies).
    const vessel = {
      thrusters: [
        { id: 'AZ1', kind: 'azimuth', rated_kw: 1800, diameter_m: 2.4, life_exponent: 3, service_interval_h: 1, wear_h_at_install: 0 },
        { id: 'T1', kind: 'tunnel', rated_kw: 1800, diameter_m: 2.4, life_exponent: 3, service_interval_h: 1, wear_h_at_install: 0 },
      ],
      buses: [{ id: 'A', rated_kw: 5000 }],
    } as unknown as FleetVessel;
    const specs = thrusterLayout(vessel, vesselModel({ type: 'construction' }).p);
    const A = (Math.PI * 2.4 * 2.4) / 4;
    expect(specs.map((s) => [s.cpp, s.idle])).toEqual([[false, FPP_IDLE], [true, CPP_IDLE]]);
    for (const [i, spec] of specs.entries()) {
      expect(spec.maxThrust).toBeCloseTo(THRUST_EFFICIENCY * idealThrust(1.8e6, A), 6);
      const bank = new ThrusterBank(specs);
      const cmd = new Float64Array(2);
      cmd[i] = 0.25 * spec.maxThrust;
      const angle = Float64Array.from(specs.map((s) => s.fixedAngle));
      for (let k = 0; k < 200; k++) bank.step(cmd, angle, Float64Array.of(1));
      expect(bank.speed[i]!).toBeCloseTo(0.5, 6); // quarter thrust at half speed (or pitch)
      expect(bank.thrust[i]!).toBeCloseTo(0.25 * spec.maxThrust, 3);
      const shaftPower = (bank.power[i]! - spec.idle * spec.ratedW) / (1 - spec.idle);
      expect(shaftPower / spec.ratedW).toBeCloseTo(0.125, 6); // eighth power at half speed
      // And momentum theory still holds with the same derating at part load.
      expect(bank.thrust[i]!).toBeCloseTo(THRUST_EFFICIENCY * idealThrust(shaftPower, A), 0);
      // Fouling: k times the power for the same thrust, so thrust per power^(2/3) falls by k^(−2/3).
      const clean = bank.thrust[i]! / bank.power[i]! ** (2 / 3);
      bank.powerFactor[i] = 1.2;
      bank.step(cmd, angle, Float64Array.of(1));
      expect(bank.thrust[i]! / bank.power[i]! ** (2 / 3) / clean).toBeCloseTo(1.2 ** (-2 / 3), 6);
    }
  });

  it('power limit scales thrust so P ∝ T^(3/2) fits the available power', () => {
    expect(powerLimitScale(1000, 2000)).toBe(1);
    const k = powerLimitScale(2000, 1000);
    expect(2000 * k ** 1.5).toBeCloseTo(1000, 9);
  });
});

describe('thrust allocation', () => {
  it('meets an unsaturated demand exactly with the real layouts (weighted pseudo-inverse)', async () => {
    const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
    for (const v of fleet.vessels) {
      const specs = thrusterLayout(v, vesselModel(v).p);
      const alloc = new Allocator(specs);
      const scale = alloc.allocate(50e3, -30e3, 2e6, new Float64Array(specs.length));
      expect(scale, v.key).toBe(1);
      const out = new Float64Array(3);
      thrustForce(specs, alloc.cmdThrust, alloc.cmdAngle, out);
      expect(out[0]!, v.key).toBeCloseTo(50e3, 3);
      expect(out[1]!, v.key).toBeCloseTo(-30e3, 3);
      expect(out[2]!, v.key).toBeCloseTo(2e6, 1);
      // Tunnels act in sway only.
      specs.forEach((s, i) => {
        if (s.kind === 'tunnel') expect(alloc.cmdAngle[i]).toBeCloseTo(Math.PI / 2, 12);
      });
    }
  });
});

describe('Rayleigh radial error (isotropic Gaussian, per-axis σ)', () => {
  it('p95/σ ≈ 2.4477 and median/σ ≈ 1.1774 through positionErrorStats’ histogram', () => {
    const rng = new SimRandom(42);
    const sigma = 2;
    const n = 200_000;
    const north = new Array<number>(n), east = new Array<number>(n);
    for (let i = 0; i < n; i++) {
      north[i] = sigma * rng.normal();
      east[i] = sigma * rng.normal();
    }
    const stats = positionErrorStats(north, east);
    expect(stats.hist.reduce((a, b) => a + b, 0)).toBe(n);
    expect(histQuantile(stats.hist, 0.95) / sigma).toBeCloseTo(RAYLEIGH_P95, 1);
    expect(Math.abs(histQuantile(stats.hist, 0.95) / sigma / 2.4477 - 1)).toBeLessThan(0.01);
    expect(Math.abs(histQuantile(stats.hist, 0.5) / sigma / 1.1774 - 1)).toBeLessThan(0.01);
    // r_rms = σ √2 for Rayleigh.
    expect(Math.abs(stats.r_rms / (sigma * Math.SQRT2) - 1)).toBeLessThan(0.01);
  });

  it('holds through the estimator: a stationary vessel, noisy references, Kalman-filtered position', () => {
    const rng = new SimRandom(7);
    const measSd = 4;
    const kfN = new AxisFilter(1e-2, 1e-9, 1), kfE = new AxisFilter(1e-2, 1e-9, 1);
    const n = 300_000;
    const north = new Array<number>(n), east = new Array<number>(n);
    let s2 = 0;
    for (let i = 0; i < 2_000 + n; i++) {
      kfN.predict(0, 1);
      kfE.predict(0, 1);
      kfN.update(measSd * rng.normal(), measSd * measSd);
      kfE.update(measSd * rng.normal(), measSd * measSd);
      if (i >= 2_000) {
        north[i - 2_000] = kfN.p;
        east[i - 2_000] = kfE.p;
        s2 += kfN.p * kfN.p + kfE.p * kfE.p;
      }
    }
    const sigma = Math.sqrt(s2 / (2 * n)); // per-axis σ of the filtered error
    const hist = positionErrorStats(north, east).hist;
    expect(Math.abs(histQuantile(hist, 0.95) / sigma / RAYLEIGH_P95 - 1)).toBeLessThan(0.04);
    expect(Math.abs(histQuantile(hist, 0.5) / sigma / RAYLEIGH_MEDIAN - 1)).toBeLessThan(0.04);
    expect(RAYLEIGH_P95).toBeCloseTo(2.4477, 4);
    expect(RAYLEIGH_MEDIAN).toBeCloseTo(1.1774, 4);
  });
});

describe('what the DP knows of the environment', () => {
  const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
  const vessel = fleet.vessels.find((v) => v.type === 'construction')!;
  const site = demoSite(fleet.vessels.indexOf(vessel));
  const T0 = Date.UTC(2026, 10, 1);
  /** Mean station env over 20 min after settling. */
  const settle = (sim: VesselSimulator) => {
    let res = 0, dir = 0;
    for (let k = 0; k < 20; k++) {
      const env = sim.interval(T0 + k * 60_000, 60).station.env!;
      res += env.residual_kn! / 20;
      dir = env.residual_to_deg!;
    }
    return { res, dir };
  };

  it('wind is the only environmental force measured directly; current shows in the estimator as an unexplained slowly varying force (common practice, no source)', () => {
    const mdl = vesselModel(vessel);
    // 0.5 m/s from ahead, no wind: the estimator's bias force must carry the whole current load,
    // quadratic drag q11·U² plus linear damping d11·U on the hull (vesselModel.ts).
    const U = 0.5;
    const toDeg = (site.heading + 180) % 360;
    const current = new VesselSimulator(vessel, site, { fixedWindMs: 0, calm: true, modes: false, warmUpS: 3600, steadyCurrent: { ms: U, toDeg } });
    const c = settle(current);
    const expectedKn = (mdl.q11 * U * U + mdl.d11 * U) / 1000;
    expect(Math.abs(c.res / expectedKn - 1)).toBeLessThan(0.1);
    expect(Math.abs(((c.dir - toDeg + 540) % 360) - 180)).toBeLessThan(10); // pushed the way the current sets
    // 14 m/s of wind and no current: the anemometer and the wind feed-forward explain the wind load
    // but for the feed-forward's model error (10 %); what remains is that and the unmeasured wave drift.
    const wind = new VesselSimulator(vessel, site, { fixedWindMs: 14, calm: true, modes: false, warmUpS: 3600 });
    const w = settle(wind);
    // The heading the vessel settled on (it may turn toward the weather), the wind from 20° off the site heading.
    const psi = wind.state.psi, from = (site.heading + 20) * DEG;
    const windLoad = new Float64Array(3), rest = new Float64Array(3);
    windForce(mdl, psi, 14, from, windLoad);
    windForce(mdl, psi, 14, from, rest, 0.1);
    waveDriftForce(mdl, psi, (0.21 * 14 * 14) / 9.80665, from, 1, rest);
    const restKn = Math.hypot(rest[0]!, rest[1]!) / 1000;
    expect(Math.abs(w.res / restKn - 1)).toBeLessThan(0.25);
    expect(w.res).toBeLessThan(Math.hypot(windLoad[0]!, windLoad[1]!) / 1000);
  });
});
