import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { authenticate } from '../lib/api/auth';
import { ApiError } from '../lib/api/errors';
import { createApiToken, revokeApiToken } from '../lib/api/tokens';
import { can } from '../lib/auth/permissions';
import type { TokenPrincipal } from '../lib/auth/principal';
import { visibleVesselKeys } from '../lib/auth/scope';
import { scopeOf } from '../lib/auth/scopeData';
import { readFleetFile } from '../lib/register/fleetFile';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet } from './helpers/fleet';

/**
 * Issue 8, "must show 3": token revocation, at the library level. A revoked
 * token is refused on its next request, at once (no cache), and a charterer
 * token reads only its campaign.
 */
describe('API tokens: revocation and scope', () => {
  let db: TestDatabase;
  const request = (token: string) => new Request('http://holdfast.test/api/v1/vessels', { headers: { authorization: `Bearer ${token}` } });
  const principal = async (token: string): Promise<TokenPrincipal> => {
    const p = await authenticate(db.pool, request(token));
    return { kind: 'token', tokenId: p.tokenId, role: p.role, campaignId: p.campaignId };
  };

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const vessel = (key: string) => ({ key, name: key, type: 'supply', dp_class: 2, watch_circles_m: [3], heading_limits_deg: [3], thrusters: [], buses: [], refs: [] });
    await registerFleet(
      db.url,
      readFleetFile(
        JSON.stringify({
          v: 1,
          vessels: [vessel('gull-one'), vessel('gull-two')],
          campaigns: [{ key: 'gull-camp', charterer: 'C', vessels: ['gull-one'], from: '2026-01-01', to: '2026-02-01', site: { name: 'S', lat: 1, lon: 2 }, watch_circles_m: [3] }],
        }),
      ),
    );
  });
  afterAll(async () => db?.drop());

  it('refuses a revoked token from its next request on', async () => {
    const { id, token } = await createApiToken(db.pool, { name: 'to be revoked', role: 'fleet_manager' });
    expect((await principal(token)).tokenId).toBe(id);
    expect(await revokeApiToken(db.pool, id)).toBe(true);
    const refused = await authenticate(db.pool, request(token)).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(ApiError);
    expect(refused).toMatchObject({ status: 401, code: 'unauthorized' });
    // The row stays, for the record, with the time of revocation.
    const { rows } = await db.pool.query('SELECT revoked_at FROM api_token WHERE id = $1', [id]);
    expect(rows[0].revoked_at).toBeInstanceOf(Date);
  });

  it('revoking one token leaves the others working', async () => {
    const a = await createApiToken(db.pool, { name: 'a', role: 'admin' });
    const b = await createApiToken(db.pool, { name: 'b', role: 'admin' });
    await revokeApiToken(db.pool, a.id);
    expect((await principal(b.token)).tokenId).toBe(b.id);
  });

  it('scopes a charterer token to its campaign and lets no token change anything', async () => {
    const { token } = await createApiToken(db.pool, { name: 'charterer', role: 'charterer', campaignKey: 'gull-camp' });
    const p = await principal(token);
    expect(visibleVesselKeys(await scopeOf(db.pool, p))).toEqual(['gull-one']);
    const admin = await principal((await createApiToken(db.pool, { name: 'admin', role: 'admin' })).token);
    expect(visibleVesselKeys(await scopeOf(db.pool, admin))).toBe('all');
    expect(can(admin, 'flag.acknowledge')).toBe(false);
    expect(can(admin, 'user.manage')).toBe(false);
  });
});
