import type { FleetVessel } from '../../lib/register/fleetFile';
import { GENS_PER_BUS } from '../sim/power';
import type { Faults, SimKnobs } from '../sim/vesselSimulator';
import { daysSinceOnset, faultsOf, type ScenarioPlan } from './plan';

/**
 * The simulator's knobs for one vessel of a scenario plan, as a function of
 * time: every fault grows linearly from its onset at the planned rate, up to
 * its limit (a generator derating starts with a step). A live run started later sets the same knobs for the same
 * instant as the backfill did. Undefined when the vessel has no fault that
 * acts on the simulation (a link outage acts on publishing only).
 */
export function faultsFor(plan: ScenarioPlan, vessel: FleetVessel): Faults | undefined {
  const setters: ((tMs: number, k: SimKnobs) => void)[] = [];
  const index = (ids: readonly { id: string }[], id: string, what: string) => {
    const i = ids.findIndex((x) => x.id === id);
    if (i < 0) throw new Error(`scenario plan: ${vessel.key} has no ${what} ${id}`);
    return i;
  };
  for (const f of faultsOf(plan, vessel.key)) {
    if (f.kind === 'link_outage') continue;
    const grown = (tMs: number) => Math.max(0, daysSinceOnset(plan, f.onsetDay, tMs)) * (f.pctPerDay / 100);
    switch (f.kind) {
      case 'thruster_fouling': {
        const i = index(vessel.thrusters, f.thruster, 'thruster');
        // Efficiency (thrust per power^(2/3)) × (1 − L) ⇔ power × (1 − L)^(−3/2) for the same thrust.
        setters.push((t, k) => {
          k.thrusterPower[i] = (1 - Math.min(grown(t), f.maxPct / 100)) ** -1.5;
        });
        break;
      }
      case 'reference_noise': {
        const i = index(vessel.refs, f.ref, 'reference system');
        setters.push((t, k) => {
          k.refNoise[i] = Math.min(1 + grown(t), f.maxFactor);
        });
        break;
      }
      case 'generator_derate': {
        const b = vessel.buses.length ? index(vessel.buses, f.bus, 'bus') : 0;
        const g = b * GENS_PER_BUS + Math.min(f.generator - 1, GENS_PER_BUS - 1);
        setters.push((t, k) => {
          if (daysSinceOnset(plan, f.onsetDay, t) < 0) return;
          k.genCapacity[g] = Math.max(f.stepPct / 100 - grown(t), f.minPct / 100);
        });
        break;
      }
      case 'controller_detune':
        setters.push((t, k) => {
          k.controllerGain = Math.max(1 - grown(t), f.minPct / 100);
        });
        break;
      case 'weather_only':
        setters.push((t, k) => {
          k.windScale = 1 + Math.min(grown(t), f.maxPct / 100);
        });
        break;
    }
  }
  if (setters.length === 0) return undefined;
  return (tMs, knobs) => {
    for (const set of setters) set(tMs, knobs);
  };
}
