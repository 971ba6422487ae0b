import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { dpHours } from '../../lib/metrics/dpIntervals';
import { efficiencyIndex } from '../../lib/metrics/efficiency';
import { limitEventsPerDpDay, powerFigures } from '../../lib/metrics/powerLimit';
import { refFigures } from '../../lib/metrics/refs';
import { stationDayFigures } from '../../lib/metrics/stationDay';
import { readFleetFile } from '../../lib/register/fleetFile';
import { demoSite } from '../sites';
import { VesselSimulator, type SimRecords } from '../sim/vesselSimulator';
import { faultsFor } from './faults';
import { groundTruth } from './groundTruth';
import { buildPlan, DAY_MS, type PlannedFault, type ScenarioPlan } from './plan';

const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
const FROM = Date.UTC(2026, 8, 1);
const KINDS = ['controller_detune', 'weather_only', 'reference_noise', 'generator_derate', 'thruster_fouling', 'link_outage'];
const METRICS = ['p95_norm', 'hdg_rms', 'efficiency_index', 'limit_events_per_dp_day', 'sd_m_median', 'rejections'];

describe('scenario plan', () => {
  it('is deterministic for a seed, and another seed places the faults elsewhere', () => {
    expect(buildPlan(fleet, 1, FROM, 60)).toEqual(buildPlan(fleet, 1, FROM, 60));
    const placed = (seed: number) => buildPlan(fleet, seed, FROM, 60).faults.map((f) => f.vessel);
    expect([2, 3, 4, 5].some((seed) => placed(seed).join() !== placed(1).join())).toBe(true);
  });

  it('seeds every fault kind on a vessel of its own, inside the history', () => {
    for (const days of [3, 60]) {
      const plan = buildPlan(fleet, 7, FROM, days);
      expect(plan.faults.map((f) => f.kind)).toEqual(KINDS);
      expect(new Set(plan.faults.map((f) => f.vessel)).size).toBe(KINDS.length);
      for (const f of plan.faults) {
        if (f.kind === 'link_outage') {
          expect(f.fromMs).toBeGreaterThanOrEqual(FROM);
          expect(f.toMs).toBeGreaterThan(f.fromMs);
          expect(f.replayMs).toBeGreaterThanOrEqual(f.toMs);
          expect(f.replayMs).toBeLessThanOrEqual(FROM + days * DAY_MS);
        } else {
          expect(f.onsetDay).toBeGreaterThanOrEqual(0);
          expect(f.onsetDay).toBeLessThan(days);
        }
      }
    }
  });

  it('ground truth: vessel, subject, metrics-v1 metric, onset day and date, direction for every fault', () => {
    const plan = buildPlan(fleet, 1, FROM, 60);
    const truth = groundTruth(plan);
    expect(truth.history).toEqual({ from: '2026-09-01T00:00:00.000Z', to: '2026-10-31T00:00:00.000Z', days: 60 });
    expect(new Set(truth.entries.map((e) => e.scenario))).toEqual(new Set(KINDS));
    for (const e of truth.entries) {
      expect(fleet.vessels.map((v) => v.key)).toContain(e.vessel);
      expect(e.subject).toMatch(/^(vessel|thruster:[A-Za-z0-9_-]+|ref:[A-Za-z0-9_-]+)$/);
      if (e.metric !== null) expect(METRICS).toContain(e.metric);
      expect(e.onset_date).toBe(new Date(FROM + e.onset_day * DAY_MS).toISOString().slice(0, 10));
      // A consequence of a fault moves its metric too, but is not required to flag.
      expect(e.expect_flag).toBe(e.direction !== 'none' && !e.consequence);
    }
    const control = truth.entries.find((e) => e.scenario === 'weather_only')!;
    expect(control).toMatchObject({ metric: 'p95_norm', direction: 'none', expect_flag: false });
    expect(truth.entries.find((e) => e.scenario === 'link_outage')!.outage).toBeDefined();
    const consequences = truth.entries.filter((e) => e.consequence).map((e) => `${e.scenario}:${e.metric}:${e.direction}`);
    expect(consequences.sort()).toEqual(['generator_derate:hdg_rms:rising', 'generator_derate:p95_norm:rising']);
  });
});

/**
 * Each fault moves its metric the planned way: the same vessel, the same
 * weather (the environment has its own random stream) and the same day,
 * simulated with the fault grown for `grownDays` and without it.
 */
describe('seeded faults show in their metrics', () => {
  const plan = buildPlan(fleet, 1, FROM, 60);
  const fault = <K extends PlannedFault['kind']>(kind: K) => plan.faults.find((f) => f.kind === kind) as Extract<PlannedFault, { kind: K }>;
  const simulate = (f: PlannedFault, grownDays: number | null, days = 1): SimRecords[] => {
    const only: ScenarioPlan = { ...plan, faults: grownDays === null ? [] : [f] };
    const onset = 'onsetDay' in f ? f.onsetDay : 0;
    const t0 = FROM + (onset + (grownDays ?? 30)) * DAY_MS;
    const i = fleet.vessels.findIndex((v) => v.key === f.vessel);
    const sim = new VesselSimulator(fleet.vessels[i]!, demoSite(i), { seed: plan.seed, faults: faultsFor(only, fleet.vessels[i]!) });
    const out: SimRecords[] = [];
    for (let k = 0; k < days * 1440; k++) out.push(sim.interval(t0 + k * 60_000, 60));
    return out;
  };

  it('thruster fouling: efficiency_index of the unit falls by the planned share', () => {
    const f = fault('thruster_fouling');
    const index = (r: SimRecords[]) => efficiencyIndex(r.flatMap((x) => x.thrusters.units.filter((u) => u.id === f.thruster)))!;
    const ratio = index(simulate(f, 30)) / index(simulate(f, null));
    expect(ratio).toBeCloseTo(1 - (30 * f.pctPerDay) / 100, 1);
    expect(Math.abs(ratio - 0.7)).toBeLessThan(0.02);
  });

  it('reference noise: sd_m_median of the system rises', () => {
    const f = fault('reference_noise');
    const sd = (r: SimRecords[]) => refFigures(r.map((x) => x.refs), f.ref).sd_m_median!;
    expect(sd(simulate(f, 30)) / sd(simulate(f, null))).toBeGreaterThan(2);
  });

  it('generator derating: limit_events_per_dp_day rises from none in the first days of the fault', () => {
    const f = fault('generator_derate');
    const perDpDay = (r: SimRecords[]) => limitEventsPerDpDay(powerFigures(r.map((x) => x.power)).limit_events ?? 0, dpHours(r.map((x) => x.station)))!;
    const healthy = perDpDay(simulate(f, null, 2));
    const derated = perDpDay(simulate(f, 0, 2)); // the step at onset bites at once
    expect(healthy).toBeLessThan(2);
    expect(derated).toBeGreaterThan(healthy + 10);
  });

  it('generator derating: station keeping suffers too, as the power limit cuts thrust (p95 and heading RMS, same weather)', () => {
    const f = fault('generator_derate');
    // Both 30 days after onset, in the same weather.
    const healthy = simulate(f, null, 2);
    const derated = simulate(f, 30, 2);
    const figures = (r: SimRecords[]) => stationDayFigures(r.map((x) => x.station));
    const ratio = (pick: (d: ReturnType<typeof stationDayFigures>) => number | null | undefined) => pick(figures(derated))! / pick(figures(healthy))!;
    // Measured: p95 ×2.5, heading RMS ×5.1. The ground truth lists both as the derating's consequences.
    expect(ratio((d) => d.p95?.m)).toBeGreaterThan(1.5);
    expect(ratio((d) => d.hdg_rms)).toBeGreaterThan(1.5);
  });

  it('controller detuning: p95 and heading RMS rise in the same weather', () => {
    const f = fault('controller_detune');
    const healthy = stationDayFigures(simulate(f, null).map((x) => x.station));
    const detuned = stationDayFigures(simulate(f, 30).map((x) => x.station));
    expect(detuned.wind_ms_mean).toBe(healthy.wind_ms_mean);
    expect(detuned.p95!.m / healthy.p95!.m).toBeGreaterThan(1.3);
    expect(detuned.hdg_rms! / healthy.hdg_rms!).toBeGreaterThan(1.3);
  });

  it('weather only (negative control): the wind itself grows, nothing on board changes', () => {
    const f = fault('weather_only');
    const calm = simulate(f, null);
    const rough = simulate(f, 30);
    const wind = (r: SimRecords[]) => stationDayFigures(r.map((x) => x.station)).wind_ms_mean!;
    expect(wind(rough) / wind(calm)).toBeCloseTo(1 + (30 * f.pctPerDay) / 100, 1);
  });
});
