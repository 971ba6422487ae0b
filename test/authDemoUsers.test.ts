import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createDemoUsers } from '../lib/auth/demoUsers';
import type { ScryptParams } from '../lib/auth/password';
import { visibleVesselKeys } from '../lib/auth/scope';
import { scopeOf } from '../lib/auth/scopeData';
import { signIn } from '../lib/auth/signIn';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';

/** Demo mode's users: one per role, random passwords, only into a store without users. */
describe('createDemoUsers', () => {
  const FAST: ScryptParams = { ln: 10, r: 8, p: 1 };
  const key = `demo-${uniqueSuffix()}`;
  let db: TestDatabase;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const fleet = smallFleet(key);
    fleet.campaigns.push({
      key: 'demo-campaign',
      charterer: 'Aldmoor Energy',
      vessels: [key],
      from: '2026-10-01',
      to: '2027-01-31',
      site: { name: 'Field', lat: 59.4, lon: 2.9 },
      watch_circles_m: [3, 5],
    });
    await registerFleet(db.url, fleet);
  });
  afterAll(async () => db?.drop());

  it('makes one user per role whose random password signs in, the charterer scoped to the demo campaign', async () => {
    const users = await createDemoUsers(db.pool, { organisationKey: 'aldmoor', organisationName: 'Aldmoor Energy', campaignKey: 'demo-campaign' }, { scrypt: FAST });
    expect(users?.map((u) => u.role)).toEqual(['admin', 'fleet_manager', 'shore_engineer', 'charterer']);
    expect(new Set(users!.map((u) => u.password)).size).toBe(4);
    for (const u of users!) {
      expect(u.password).toMatch(/^[A-Za-z0-9_-]{24}$/);
      const result = await signIn(db.pool, { email: u.email, password: u.password }, { scrypt: FAST });
      expect(result.kind, u.email).toBe('ok');
      if (result.kind === 'ok' && u.role === 'charterer') expect(visibleVesselKeys(await scopeOf(db.pool, result.principal))).toEqual([key]);
    }
  });

  it('does nothing once any user exists', async () => {
    expect(await createDemoUsers(db.pool, { organisationKey: 'aldmoor', organisationName: 'Aldmoor Energy', campaignKey: 'demo-campaign' }, { scrypt: FAST })).toBeNull();
    expect((await db.pool.query('SELECT count(*)::int AS n FROM app_user')).rows[0].n).toBe(4);
  });
});
