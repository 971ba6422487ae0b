import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { readFleetFile } from '../../lib/register/fleetFile';
import { demoSite } from '../sites';
import { AUTO_POSITION, AUTO_TRACK, JOYSTICK, MODE_NAMES, ModeSchedule, patternFor, STANDBY } from './modes';
import { VesselSimulator, type SimRecords } from './vesselSimulator';

const fleet = readFleetFile(readFileSync('seed/fleet.json', 'utf8'));
const T0 = Date.UTC(2026, 9, 1) / 1000;

/** Share of 60 days in each mode, by the second. */
function shares(type: string, seed: number): number[] {
  const s = new ModeSchedule(patternFor(type), seed);
  const count = new Array<number>(MODE_NAMES.length).fill(0);
  for (let t = T0; t < T0 + 60 * 86_400; t += 60) count[s.modeAt(t)]!++;
  return count.map((c) => c / (60 * 1440));
}

describe('DP modes', () => {
  it('follow a pattern per vessel type, the same for a seed, whatever time is asked first', () => {
    const a = new ModeSchedule(patternFor('supply'), 3), b = new ModeSchedule(patternFor('supply'), 3);
    const late = T0 + 40 * 86_400;
    const fromLate = Array.from({ length: 100 }, (_, k) => a.modeAt(late + k * 900));
    b.modeAt(T0);
    expect(Array.from({ length: 100 }, (_, k) => b.modeAt(late + k * 900))).toEqual(fromLate);
    expect(a.modeAt(T0)).toBe(b.modeAt(T0)); // going back in time regenerates

    const drilling = shares('drilling', 1), construction = shares('construction', 1);
    const supply = shares('supply', 1), shuttle = shares('shuttle tanker', 1);
    expect(drilling[AUTO_POSITION]).toBeGreaterThan(0.95);
    expect(construction[AUTO_POSITION]).toBeGreaterThan(0.6);
    expect(construction[AUTO_TRACK]).toBeGreaterThan(0.02);
    expect(construction[STANDBY]).toBeGreaterThan(0);
    for (const s of [supply, shuttle]) {
      expect(s[AUTO_POSITION]).toBeGreaterThan(0.2);
      expect(s[AUTO_POSITION]).toBeLessThan(0.55);
      expect(s[STANDBY]).toBeGreaterThan(0.4);
      expect(s[JOYSTICK]).toBeGreaterThan(0);
    }
  });

  it('in the records: standby without position error, thrusters started on return, passage on the main propellers, generators started and stopped', () => {
    const i = fleet.vessels.findIndex((v) => v.type === 'supply');
    const vessel = fleet.vessels[i]!;
    const sim = new VesselSimulator(vessel, demoSite(i));
    const records: SimRecords[] = [];
    for (let k = 0; k < 2 * 1440; k++) records.push(sim.interval((T0 + k * 60) * 1000, 60));
    const modes = new Set(records.map((r) => r.station.mode));
    expect([...modes].sort()).toEqual(['auto_position', 'joystick', 'standby']);
    for (const r of records) {
      expect(r.station.dp_s).toBeLessThanOrEqual(r.station.mode === 'auto_position' ? 60 : 59);
      if (r.station.n === 0) expect(r.station.err).toBeUndefined();
      else expect(r.station.err!.hist!.reduce((a, b) => a + b, 0)).toBe(r.station.n);
    }
    const passage = records.filter((r) => r.station.mode === 'standby' && r.station.n === 0);
    expect(passage.length).toBeGreaterThan(60);
    for (const r of passage) {
      for (const u of r.thrusters.units) {
        const main = vessel.thrusters.find((t) => t.id === u.id)!.kind === 'main';
        expect(u.run_s, u.id).toBe(main ? 60 : 0);
        if (main) expect(u.load_pct_mean!).toBeGreaterThan(40);
      }
    }
    // Tunnel thrusters start again for every approach.
    const starts = records.flatMap((r) => r.thrusters.units).filter((u) => u.id.startsWith('BT')).reduce((a, u) => a + u.starts, 0);
    expect(starts).toBeGreaterThan(0);
    // Load spread: controllable-pitch tunnels idle at 12 % of rating on DP, mains work in higher bands on passage.
    const bands = new Set(records.flatMap((r) => r.thrusters.units.flatMap((u) => (u.load_band_s ?? []).map((s, b) => (s > 0 ? b : -1)))).filter((b) => b >= 0));
    expect(bands.size).toBeGreaterThanOrEqual(3);
    const gens = new Set(records.flatMap((r) => r.power.buses.map((b) => b.gens_online)));
    expect([...gens].sort()).toEqual([1, 2]);
  });

  it('auto_track moves the set point; auto_position holds it', () => {
    const i = fleet.vessels.findIndex((v) => v.type === 'construction');
    const sim = new VesselSimulator(fleet.vessels[i]!, demoSite(i));
    let moved = 0, held = 0;
    let last: SimRecords | undefined;
    for (let k = 0; k < 3 * 1440; k++) {
      const r = sim.interval((T0 + k * 60) * 1000, 60);
      if (last?.station.sp && r.station.sp && last.station.mode === r.station.mode) {
        const same = last.station.sp.lat === r.station.sp.lat && last.station.sp.lon === r.station.sp.lon;
        if (r.station.mode === 'auto_track' && !same) moved++;
        if (r.station.mode === 'auto_position' && same) held++;
      }
      last = r;
    }
    expect(moved).toBeGreaterThan(30);
    expect(held).toBeGreaterThan(1000);
  });
});
