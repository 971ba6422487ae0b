import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { assignCampaign, ensureOrganisation, OrganisationInputError } from '../lib/auth/organisations';
import type { Principal } from '../lib/auth/principal';
import { canSeeCampaign, canSeeDay, visibleDays, visibleVesselKeys } from '../lib/auth/scope';
import { loadCampaignFacts, scopeOf } from '../lib/auth/scopeData';
import { readFleetFile } from '../lib/register/fleetFile';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, uniqueSuffix } from './helpers/fleet';

/**
 * The tenancy rule on a real register: campaigns and organisations read from
 * PostgreSQL (dates as fleet days, never shifted by a time zone) into the
 * pure rule of lib/auth/scope.ts.
 */
const s = uniqueSuffix();
const vessel = (key: string) => ({ key, name: key, type: 'supply', dp_class: 2, watch_circles_m: [3, 5], heading_limits_deg: [3, 5], thrusters: [], buses: [], refs: [] });
const campaign = (key: string, vessels: string[], from: string, to: string) => ({
  key,
  charterer: 'Test Charterer',
  vessels,
  from,
  to,
  site: { name: 'Test Field', lat: 60, lon: 2 },
  watch_circles_m: [3, 5],
});

describe('scopeOf, reading the register', () => {
  let db: TestDatabase;
  let aldmoor: number;
  let veskel: number;
  const ids: Record<string, number> = {};

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(
      db.url,
      readFleetFile(
        JSON.stringify({
          v: 1,
          vessels: [vessel('tern-a'), vessel('tern-b'), vessel('tern-c'), vessel('tern-d')],
          campaigns: [
            campaign('tieback-1', ['tern-a', 'tern-b'], '2026-10-01', '2026-10-31'),
            campaign('tieback-2', ['tern-a'], '2026-11-01', '2026-11-30'),
            campaign('offtake', ['tern-b', 'tern-c'], '2026-10-15', '2027-01-31'),
            campaign('unassigned', ['tern-d'], '2026-01-01', '2026-12-31'),
          ],
        }),
      ),
    );
    aldmoor = (await ensureOrganisation(db.pool, `aldmoor-${s}`, 'Aldmoor Energy')).id;
    veskel = (await ensureOrganisation(db.pool, `veskel-${s}`)).id;
    for (const key of ['tieback-1', 'tieback-2']) expect(await assignCampaign(db.pool, key, aldmoor)).toBe(true);
    expect(await assignCampaign(db.pool, 'offtake', veskel)).toBe(true);
    expect(await assignCampaign(db.pool, 'no-such-campaign', veskel)).toBe(false);
    for (const row of (await db.pool.query<{ id: number; key: string }>('SELECT id, key FROM campaign')).rows) ids[row.key] = row.id;
  });
  afterAll(async () => db?.drop());

  const charterer = (organisationId: number | null): Principal => ({ kind: 'user', userId: 1, email: 'c@example.com', role: 'charterer', organisationId });

  it('reads campaign days as written, whatever the time zone of the process', async () => {
    const facts = await loadCampaignFacts(db.pool);
    expect(facts.find((c) => c.key === 'tieback-1')).toEqual({
      id: ids['tieback-1'],
      key: 'tieback-1',
      organisationId: aldmoor,
      fromDay: '2026-10-01',
      toDay: '2026-10-31',
      vesselKeys: ['tern-a', 'tern-b'],
    });
    expect(facts.find((c) => c.key === 'unassigned')?.organisationId).toBeNull();
  });

  it("gives a charterer user its organisation's vessels on its campaigns' days", async () => {
    const scope = await scopeOf(db.pool, charterer(aldmoor));
    expect(visibleVesselKeys(scope)).toEqual(['tern-a', 'tern-b']);
    expect(visibleDays(scope, 'tern-a')).toEqual([{ from: '2026-10-01', to: '2026-11-30' }]);
    expect(visibleDays(scope, 'tern-b')).toEqual([{ from: '2026-10-01', to: '2026-10-31' }]);
    expect(canSeeDay(scope, 'tern-b', '2026-11-01')).toBe(false); // offtake's days are Veskel's
    expect(canSeeCampaign(scope, 'offtake')).toBe(false);

    const other = await scopeOf(db.pool, charterer(veskel));
    expect(visibleVesselKeys(other)).toEqual(['tern-b', 'tern-c']);
    expect(canSeeDay(other, 'tern-b', '2026-10-14')).toBe(false);
    expect(canSeeDay(other, 'tern-b', '2026-10-15')).toBe(true);
  });

  it('gives a charterer token its one campaign', async () => {
    const scope = await scopeOf(db.pool, { kind: 'token', tokenId: 1, role: 'charterer', campaignId: ids['tieback-2']! });
    expect(visibleVesselKeys(scope)).toEqual(['tern-a']);
    expect(visibleDays(scope, 'tern-a')).toEqual([{ from: '2026-11-01', to: '2026-11-30' }]);
  });

  it('gives nothing to a charterer without an organisation, or whose organisation has no campaign', async () => {
    expect(visibleVesselKeys(await scopeOf(db.pool, charterer(null)))).toEqual([]);
    const empty = (await ensureOrganisation(db.pool, `empty-${s}`)).id;
    expect(visibleVesselKeys(await scopeOf(db.pool, charterer(empty)))).toEqual([]);
  });

  it('gives the whole fleet to the other roles without reading campaigns', async () => {
    for (const role of ['admin', 'fleet_manager', 'shore_engineer'] as const) {
      expect(visibleVesselKeys(await scopeOf(db.pool, { kind: 'token', tokenId: 1, role, campaignId: null }))).toBe('all');
    }
  });

  it('applies a new assignment at once', async () => {
    expect(await assignCampaign(db.pool, 'unassigned', aldmoor)).toBe(true);
    expect(visibleVesselKeys(await scopeOf(db.pool, charterer(aldmoor)))).toEqual(['tern-a', 'tern-b', 'tern-d']);
    expect(await assignCampaign(db.pool, 'unassigned', null)).toBe(true);
    expect(visibleVesselKeys(await scopeOf(db.pool, charterer(aldmoor)))).toEqual(['tern-a', 'tern-b']);
  });

  it('makes organisations once, with checked keys', async () => {
    const again = await ensureOrganisation(db.pool, `aldmoor-${s}`, 'Another Name');
    expect(again).toEqual({ id: aldmoor, created: false });
    await expect(ensureOrganisation(db.pool, 'Bad Key')).rejects.toThrow(OrganisationInputError);
  });
});
