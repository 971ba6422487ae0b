import type { FleetFile, FleetVessel } from '../../lib/register/fleetFile';
import { Random, seedOf } from '../random';
import { busOfThruster } from '../sim/thrusters';

/**
 * Which vessel gets which seeded fault, from when, and how fast: the demo's
 * scenario plan. Deterministic for (fleet, seed, history start, days).
 *
 * Every rate below is invented: chosen so that each fault shows clearly in
 * its daily metric within a few weeks of typical demo weather, without
 * stopping the vessel from holding station.
 *
 * - thruster_fouling: a unit draws ever more power for the same thrust, so its
 *   efficiency_index (thrust per power^(2/3)) falls FOULING_PCT_PER_DAY % a
 *   day (of the clean figure) from onset, down to −FOULING_MAX_PCT %.
 * - reference_noise: a position reference's noise (white and wander) grows by
 *   REF_NOISE_PCT_PER_DAY % of its nominal figure a day, up to ×REF_NOISE_MAX.
 * - generator_derate: the lead generator of the section that feeds the most
 *   DP thruster power (every unit but the main propellers) loses power at
 *   onset, as an engine does when a turbocharger or a fuel pump fails: from
 *   then on it can deliver only DERATE_STEP_PCT % of its rating, and
 *   DERATE_PCT_PER_DAY % less every day after, down to DERATE_MIN_PCT %. The
 *   power limit cuts in from the first day on DP. (A derating that only grew
 *   slowly from 100 % stayed invisible until the generator fell below the
 *   section's peak DP demand, which on the demo's supply vessels is under half
 *   of one generator's rating: 15–21 days of a fault that nothing on board,
 *   and nothing in the telemetry, could show.)
 * - controller_detune: the DP controller's gains fall DETUNE_PCT_PER_DAY % a day
 *   down to DETUNE_MIN_PCT %: position and heading accuracy worsen in the same
 *   weather.
 * - weather_only (negative control): a healthy vessel's mean wind grows
 *   WEATHER_PCT_PER_DAY % a day, up to +WEATHER_MAX_PCT % (and the sea state
 *   with it); its environment-normalised accuracy must not be flagged.
 * - link_outage: a vessel's link is down OUTAGE_H hours; its gateway keeps the
 *   records and sends them late, as `records` batches, some hours after the
 *   link returns.
 */

export const FOULING_PCT_PER_DAY = 1;
export const FOULING_MAX_PCT = 40;
export const REF_NOISE_PCT_PER_DAY = 8;
export const REF_NOISE_MAX = 4;
export const DERATE_STEP_PCT = 40;
export const DERATE_PCT_PER_DAY = 0.5;
export const DERATE_MIN_PCT = 30;
export const DETUNE_PCT_PER_DAY = 2.5;
export const DETUNE_MIN_PCT = 25;
export const WEATHER_PCT_PER_DAY = 1.5;
export const WEATHER_MAX_PCT = 50;
export const OUTAGE_H = [10, 16] as const;
export const REPLAY_DELAY_H = [6, 30] as const;

interface Onset {
  vessel: string;
  /** Day of the history (0 = its first day) from whose start the fault grows. */
  onsetDay: number;
}

export type PlannedFault =
  | (Onset & { kind: 'thruster_fouling'; thruster: string; pctPerDay: number; maxPct: number })
  | (Onset & { kind: 'reference_noise'; ref: string; pctPerDay: number; maxFactor: number })
  | (Onset & { kind: 'generator_derate'; bus: string; generator: number; stepPct: number; pctPerDay: number; minPct: number })
  | (Onset & { kind: 'controller_detune'; pctPerDay: number; minPct: number })
  | (Onset & { kind: 'weather_only'; pctPerDay: number; maxPct: number })
  | { kind: 'link_outage'; vessel: string; fromMs: number; toMs: number; replayMs: number };

export type FaultKind = PlannedFault['kind'];

export interface ScenarioPlan {
  seed: number;
  /** Start of the history (UTC midnight), ms; day d of the history starts at fromMs + d days. */
  fromMs: number;
  days: number;
  faults: PlannedFault[];
}

const DAY_MS = 86_400_000;

/** Which vessel types suit each fault, in order of preference (any vessel when none is left). */
const SUITS: Record<FaultKind, readonly string[]> = {
  controller_detune: ['construction', 'drilling'],
  weather_only: ['construction', 'drilling'],
  reference_noise: ['construction', 'drilling', 'supply'],
  // Supply vessels' sections are the tightest for their DP load: the limit shows there first.
  generator_derate: ['supply', 'construction'],
  thruster_fouling: ['drilling', 'construction', 'supply'],
  link_outage: [],
};
const ORDER: FaultKind[] = ['controller_detune', 'weather_only', 'reference_noise', 'generator_derate', 'thruster_fouling', 'link_outage'];

/**
 * The plan for `days` of history from `fromMs` (UTC midnight). Each fault
 * goes to a different vessel; a fleet with fewer vessels than faults gets the
 * first ones of ORDER only.
 */
export function buildPlan(fleet: Pick<FleetFile, 'vessels'>, seed: number, fromMs: number, days: number): ScenarioPlan {
  const rng = new Random((seedOf('holdfast-demo-scenarios') ^ seed) >>> 0);
  const used = new Set<string>();
  const pick = (kind: FaultKind): FleetVessel | undefined => {
    const free = shuffle(fleet.vessels.filter((v) => !used.has(v.key)), rng);
    const type = (v: FleetVessel) => v.type.trim().toLowerCase();
    const rank = (v: FleetVessel) => {
      const i = SUITS[kind].indexOf(type(v));
      return i < 0 ? SUITS[kind].length : i;
    };
    // The preferred types first, in random order within each.
    const chosen = free.sort((a, b) => rank(a) - rank(b))[0];
    if (chosen) used.add(chosen.key);
    return chosen;
  };
  const uniform = (a: number, b: number) => a + (b - a) * rng.next();
  const onsetDay = (a: number, b: number) => Math.min(days - 1, Math.max(0, Math.floor(days * uniform(a, b))));
  const one = <T>(items: readonly T[]) => items[Math.floor(rng.next() * items.length)]!;

  const faults: PlannedFault[] = [];
  for (const kind of ORDER) {
    const v = pick(kind);
    if (!v) break;
    switch (kind) {
      case 'thruster_fouling': {
        const candidates = v.thrusters.filter((t) => t.kind !== 'main');
        const thruster = one(candidates.length ? candidates : v.thrusters).id;
        faults.push({ kind, vessel: v.key, onsetDay: onsetDay(0.35, 0.5), thruster, pctPerDay: FOULING_PCT_PER_DAY, maxPct: FOULING_MAX_PCT });
        break;
      }
      case 'reference_noise':
        faults.push({ kind, vessel: v.key, onsetDay: onsetDay(0.35, 0.5), ref: one(v.refs).id, pctPerDay: REF_NOISE_PCT_PER_DAY, maxFactor: REF_NOISE_MAX });
        break;
      case 'generator_derate':
        faults.push({ kind, vessel: v.key, onsetDay: onsetDay(0.35, 0.5), bus: busMostOnDp(v), generator: 1, stepPct: DERATE_STEP_PCT, pctPerDay: DERATE_PCT_PER_DAY, minPct: DERATE_MIN_PCT });
        break;
      case 'controller_detune':
        faults.push({ kind, vessel: v.key, onsetDay: onsetDay(0.35, 0.5), pctPerDay: DETUNE_PCT_PER_DAY, minPct: DETUNE_MIN_PCT });
        break;
      case 'weather_only':
        faults.push({ kind, vessel: v.key, onsetDay: onsetDay(0.3, 0.45), pctPerDay: WEATHER_PCT_PER_DAY, maxPct: WEATHER_MAX_PCT });
        break;
      case 'link_outage': {
        const endMs = fromMs + days * DAY_MS;
        // In the later part of the history (the middle third of a short one), whole minutes.
        const start = fromMs + Math.floor((days >= 5 ? uniform(0.55, 0.8) : uniform(0.3, 0.45)) * days * 1440) * 60_000;
        const to = Math.min(endMs, start + Math.round(uniform(OUTAGE_H[0], OUTAGE_H[1]) * 60) * 60_000);
        const replayMs = Math.min(endMs, to + Math.round(uniform(REPLAY_DELAY_H[0], REPLAY_DELAY_H[1]) * 60) * 60_000);
        faults.push({ kind, vessel: v.key, fromMs: start, toMs: to, replayMs });
        break;
      }
    }
  }
  return { seed, fromMs, days, faults };
}

/** The section feeding the most rated power of DP thrusters (all but main propellers); the first on a tie. */
function busMostOnDp(v: FleetVessel): string {
  if (!v.buses.length) return 'MAIN';
  const kw = v.buses.map(() => 0);
  v.thrusters.forEach((t, i) => {
    const b = busOfThruster(v, i);
    if (t.kind !== 'main') kw[b] = kw[b]! + t.rated_kw;
  });
  return v.buses[kw.indexOf(Math.max(...kw))]!.id;
}

/** Days since the fault's onset at tMs (≤ 0 before it). */
export function daysSinceOnset(plan: Pick<ScenarioPlan, 'fromMs'>, onsetDay: number, tMs: number): number {
  return (tMs - plan.fromMs) / DAY_MS - onsetDay;
}

export function faultsOf(plan: ScenarioPlan, vessel: string): PlannedFault[] {
  return plan.faults.filter((f) => f.vessel === vessel);
}

/** Fisher–Yates shuffle in place (R. A. Fisher and F. Yates 1938; Durstenfeld's form). */
function shuffle<T>(items: T[], rng: Random): T[] {
  for (let i = items.length - 1; i > 0; i--) {
    const j = Math.floor(rng.next() * (i + 1));
    [items[i], items[j]] = [items[j]!, items[i]!];
  }
  return items;
}

export { DAY_MS };
