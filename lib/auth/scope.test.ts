import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { addDays } from '../time/fleetDay';
import type { Principal } from './principal';
import { ROLES, type Role } from './roles';
import {
  canSeeCampaign,
  canSeeDay,
  canSeeSpan,
  canSeeVessel,
  clipToScope,
  scopeFor,
  visibleDays,
  visibleVesselKeys,
  type CampaignFacts,
} from './scope';

// Two organisations; organisation 1 has two back-to-back campaigns and one
// later campaign after a gap; organisation 2 shares a vessel with 1.
const CAMPAIGNS: CampaignFacts[] = [
  { id: 1, key: 'north-a', organisationId: 1, fromDay: '2026-01-01', toDay: '2026-01-31', vesselKeys: ['alpha', 'bravo'] },
  { id: 2, key: 'north-b', organisationId: 1, fromDay: '2026-02-01', toDay: '2026-02-28', vesselKeys: ['alpha'] },
  { id: 3, key: 'north-c', organisationId: 1, fromDay: '2026-03-02', toDay: '2026-03-10', vesselKeys: ['alpha'] },
  { id: 4, key: 'south', organisationId: 2, fromDay: '2026-01-15', toDay: '2026-04-30', vesselKeys: ['bravo', 'charlie'] },
  // A campaign of no organisation: nobody's, not even a charterer whose organisation is unknown.
  { id: 5, key: 'orphan', organisationId: null, fromDay: '2026-01-01', toDay: '2026-12-31', vesselKeys: ['delta'] },
];

const user = (role: Role, organisationId: number | null = null): Principal => ({ kind: 'user', userId: 1, email: 'u@example.com', role, organisationId });
const token = (role: Role, campaignId: number | null = null): Principal => ({ kind: 'token', tokenId: 1, role, campaignId });

describe('scopeFor: who sees the fleet', () => {
  it.each(['admin', 'fleet_manager', 'shore_engineer'] as const)('%s (user or token) sees every vessel and every day', (role) => {
    for (const p of [user(role), user(role, 2), token(role)]) {
      const scope = scopeFor(p, CAMPAIGNS);
      expect(scope.kind).toBe('fleet');
      expect(visibleVesselKeys(scope)).toBe('all');
      expect(canSeeVessel(scope, 'not-in-any-campaign')).toBe(true);
      expect(canSeeDay(scope, 'alpha', '1999-12-31')).toBe(true);
      expect(canSeeSpan(scope, 'alpha', '2020-01-01', '2030-01-01')).toBe(true);
      expect(clipToScope(scope, 'alpha', '2026-01-01', '2026-01-05')).toEqual([{ from: '2026-01-01', to: '2026-01-05' }]);
      expect(canSeeCampaign(scope, 'south')).toBe(true);
    }
  });

  it('a role the code does not know sees nothing', () => {
    const scope = scopeFor({ kind: 'user', userId: 1, email: 'x', role: 'auditor' as Role, organisationId: 1 }, CAMPAIGNS);
    expect(visibleVesselKeys(scope)).toEqual([]);
    expect(canSeeCampaign(scope, 'north-a')).toBe(false);
  });
});

describe('scopeFor: a charterer user', () => {
  const north = scopeFor(user('charterer', 1), CAMPAIGNS);
  const south = scopeFor(user('charterer', 2), CAMPAIGNS);

  it("sees only the vessels of its organisation's campaigns, and those campaigns", () => {
    expect(visibleVesselKeys(north)).toEqual(['alpha', 'bravo']);
    expect(visibleVesselKeys(south)).toEqual(['bravo', 'charlie']);
    expect(canSeeVessel(north, 'charlie')).toBe(false);
    expect(canSeeVessel(north, 'delta')).toBe(false);
    expect(['north-a', 'north-b', 'north-c', 'south', 'orphan'].filter((k) => canSeeCampaign(north, k))).toEqual(['north-a', 'north-b', 'north-c']);
    expect(['north-a', 'north-b', 'north-c', 'south', 'orphan'].filter((k) => canSeeCampaign(south, k))).toEqual(['south']);
  });

  it('sees a vessel only on the days of its own campaigns, both ends included', () => {
    expect(canSeeDay(north, 'bravo', '2025-12-31')).toBe(false);
    expect(canSeeDay(north, 'bravo', '2026-01-01')).toBe(true);
    expect(canSeeDay(north, 'bravo', '2026-01-31')).toBe(true);
    // bravo is also in organisation 2's campaign until April: not organisation 1's business.
    expect(canSeeDay(north, 'bravo', '2026-02-01')).toBe(false);
    expect(canSeeDay(south, 'bravo', '2026-01-14')).toBe(false);
    expect(canSeeDay(south, 'bravo', '2026-01-15')).toBe(true);
    expect(canSeeDay(south, 'bravo', '2026-04-30')).toBe(true);
    expect(canSeeDay(south, 'bravo', '2026-05-01')).toBe(false);
  });

  it('joins back-to-back campaigns into one window and keeps a gap a gap', () => {
    expect(visibleDays(north, 'alpha')).toEqual([
      { from: '2026-01-01', to: '2026-02-28' },
      { from: '2026-03-02', to: '2026-03-10' },
    ]);
    expect(canSeeDay(north, 'alpha', '2026-03-01')).toBe(false); // the gap
    expect(canSeeSpan(north, 'alpha', '2026-01-20', '2026-02-10')).toBe(true); // across the join
    expect(canSeeSpan(north, 'alpha', '2026-02-20', '2026-03-05')).toBe(false); // across the gap
    expect(canSeeSpan(north, 'alpha', '2025-12-31', '2026-01-10')).toBe(false); // starts a day early
    expect(canSeeSpan(north, 'alpha', '2026-03-05', '2026-03-04')).toBe(false); // empty span
  });

  it('clips a requested range to the visible days', () => {
    expect(clipToScope(north, 'alpha', '2026-02-20', '2026-03-31')).toEqual([
      { from: '2026-02-20', to: '2026-02-28' },
      { from: '2026-03-02', to: '2026-03-10' },
    ]);
    expect(clipToScope(north, 'charlie', '2026-01-01', '2026-12-31')).toEqual([]);
    expect(clipToScope(north, 'alpha', '2027-01-01', '2027-12-31')).toEqual([]);
    expect(clipToScope(north, 'alpha', '2026-01-10', '2026-01-01')).toEqual([]);
  });

  it('sees nothing without an organisation, even campaigns that have none', () => {
    const scope = scopeFor(user('charterer', null), CAMPAIGNS);
    expect(visibleVesselKeys(scope)).toEqual([]);
    expect(canSeeVessel(scope, 'delta')).toBe(false);
    expect(canSeeCampaign(scope, 'orphan')).toBe(false);
  });

  it('sees nothing when its organisation has no campaign', () => {
    expect(visibleVesselKeys(scopeFor(user('charterer', 99), CAMPAIGNS))).toEqual([]);
  });
});

describe('scopeFor: a charterer token', () => {
  it('sees its one campaign, not the other campaigns of the same organisation', () => {
    const scope = scopeFor(token('charterer', 2), CAMPAIGNS);
    expect(visibleVesselKeys(scope)).toEqual(['alpha']);
    expect(visibleDays(scope, 'alpha')).toEqual([{ from: '2026-02-01', to: '2026-02-28' }]);
    expect(canSeeCampaign(scope, 'north-b')).toBe(true);
    expect(canSeeCampaign(scope, 'north-a')).toBe(false);
    expect(canSeeVessel(scope, 'bravo')).toBe(false);
  });

  it('sees nothing without a campaign, or with one that no longer exists', () => {
    expect(visibleVesselKeys(scopeFor(token('charterer', null), CAMPAIGNS))).toEqual([]);
    expect(visibleVesselKeys(scopeFor(token('charterer', 42), CAMPAIGNS))).toEqual([]);
  });
});

/**
 * The rule written the plainest way, day by day, to check the functions
 * against on random fleets: a charterer sees (vessel, day) when one of its
 * campaigns holds the vessel and the day; every other known role sees all.
 */
function oracle(p: Principal, campaigns: CampaignFacts[], vessel: string, day: string): boolean {
  if (p.role === 'admin' || p.role === 'fleet_manager' || p.role === 'shore_engineer') return true;
  if (p.role !== 'charterer') return false;
  return campaigns.some((c) => {
    const mine = p.kind === 'token' ? p.campaignId !== null && c.id === p.campaignId : p.organisationId !== null && c.organisationId === p.organisationId;
    return mine && c.vesselKeys.includes(vessel) && c.fromDay <= day && day <= c.toDay;
  });
}

const BASE = '2026-01-01';
const VESSELS = ['v1', 'v2', 'v3', 'v4'];
const day = (n: number) => addDays(BASE, n);

const campaignsArb = fc
  .array(
    fc.record({
      organisationId: fc.option(fc.integer({ min: 1, max: 3 }), { nil: null }),
      start: fc.integer({ min: 0, max: 40 }),
      length: fc.integer({ min: 0, max: 15 }),
      vesselKeys: fc.subarray(VESSELS),
    }),
    { maxLength: 6 },
  )
  .map((list) =>
    list.map((c, i) => ({ id: i + 1, key: `c${i + 1}`, organisationId: c.organisationId, fromDay: day(c.start), toDay: day(c.start + c.length), vesselKeys: c.vesselKeys })),
  );

const principalArb: fc.Arbitrary<Principal> = fc.oneof(
  fc.record({
    kind: fc.constant('user' as const),
    userId: fc.constant(1),
    email: fc.constant('u@example.com'),
    role: fc.constantFrom(...ROLES),
    organisationId: fc.option(fc.integer({ min: 1, max: 3 }), { nil: null }),
  }),
  fc.record({
    kind: fc.constant('token' as const),
    tokenId: fc.constant(1),
    role: fc.constantFrom(...ROLES),
    campaignId: fc.option(fc.integer({ min: 1, max: 7 }), { nil: null }),
  }),
);

describe('scopeFor agrees with the day-by-day rule on random fleets', () => {
  it('for every vessel and day, span and clipped range', () => {
    fc.assert(
      fc.property(campaignsArb, principalArb, fc.integer({ min: -3, max: 60 }), fc.integer({ min: 0, max: 20 }), (campaigns, p, a, len) => {
        const scope = scopeFor(p, campaigns);
        for (const vessel of VESSELS) {
          const seen = Array.from({ length: 66 }, (_, i) => day(i - 3)).filter((d) => oracle(p, campaigns, vessel, d));
          for (let i = -3; i < 63; i++) expect(canSeeDay(scope, vessel, day(i))).toBe(oracle(p, campaigns, vessel, day(i)));
          expect(canSeeVessel(scope, vessel)).toBe(scope.kind === 'fleet' || seen.length > 0);
          // A span is visible exactly when each of its days is.
          const from = day(a);
          const to = day(a + len);
          const every = Array.from({ length: len + 1 }, (_, k) => day(a + k)).every((d) => oracle(p, campaigns, vessel, d));
          expect(canSeeSpan(scope, vessel, from, to)).toBe(every);
          // The clipped parts hold exactly the visible days of the range.
          const clipped = clipToScope(scope, vessel, from, to).flatMap((r) => {
            const out: string[] = [];
            for (let d = r.from; d <= r.to; d = addDays(d, 1)) out.push(d);
            return out;
          });
          const expected = Array.from({ length: len + 1 }, (_, k) => day(a + k)).filter((d) => oracle(p, campaigns, vessel, d));
          expect(clipped).toEqual(expected);
        }
        const keys = campaigns.map((c) => c.key);
        for (const key of keys) {
          const c = campaigns.find((x) => x.key === key)!;
          const mine =
            p.role === 'charterer' &&
            (p.kind === 'token' ? p.campaignId !== null && c.id === p.campaignId : p.organisationId !== null && c.organisationId === p.organisationId);
          expect(canSeeCampaign(scope, key)).toBe(p.role !== 'charterer' || mine);
        }
      }),
      { numRuns: 400 },
    );
  });
});
