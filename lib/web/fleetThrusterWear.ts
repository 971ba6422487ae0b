import type { Queryable } from '../api/context';
import { getThrusterWear } from '../queries/thrusterWear';
import type { RankingThruster } from './fleetRanking';
import { staleWhileRevalidate } from './memo';

/**
 * Fleet-wide thruster wear for the ranking, kept for WEAR_TTL_MS: summing
 * every thruster's whole daily history costs far more than the rest of the
 * fleet page (issue 7's target is 150 ms), and wear against a service
 * interval of thousands of hours moves by a few hours a day. The vessel page
 * reads its own thrusters live. Keyed by fleet day, so a new day reloads.
 */
export const WEAR_TTL_MS = 5 * 60 * 1000;

const holder = globalThis as typeof globalThis & {
  __holdfastWear?: { db: Queryable; get: (asOf: string) => Promise<RankingThruster[]> };
};

export function fleetThrusterWear(db: Queryable, asOf: string): Promise<RankingThruster[]> {
  if (!holder.__holdfastWear || holder.__holdfastWear.db !== db) {
    holder.__holdfastWear = { db, get: staleWhileRevalidate(WEAR_TTL_MS, (day) => getThrusterWear(db, day)) };
  }
  return holder.__holdfastWear.get(asOf);
}
