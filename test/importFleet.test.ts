import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPrisma, type PrismaClient } from '../lib/db/prisma';
import { readFleetFile, type FleetFile } from '../lib/register/fleetFile';
import { importFleet } from '../lib/register/importFleet';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';

const base = {
  v: 1,
  vessels: [
    {
      key: 'imp-alpha', name: 'Imp Alpha', type: 'construction', dp_class: 2,
      watch_circles_m: [3, 5], heading_limits_deg: [3, 5],
      thrusters: [
        { id: 'T1', kind: 'tunnel', rated_kw: 1500, diameter_m: 2.2, service_interval_h: 20000 },
        { id: 'T2', kind: 'azimuth', rated_kw: 2500, service_interval_h: 25000, life_exponent: 3.333 },
      ],
      buses: [{ id: 'A', rated_kw: 6000 }],
      refs: [{ id: 'GNSS1', kind: 'gnss' }],
    },
    {
      key: 'imp-bravo', name: 'Imp Bravo', type: 'supply', dp_class: 3,
      watch_circles_m: [2, 4], heading_limits_deg: [2, 4],
      thrusters: [], buses: [], refs: [],
    },
  ],
  campaigns: [
    {
      key: 'imp-camp', charterer: 'Imp Charterer', vessels: ['imp-alpha'], from: '2026-01-01', to: '2026-03-31',
      site: { name: 'Imp Field', lat: 58.1, lon: 2.3 }, watch_circles_m: [3, 5],
    },
  ],
};
const file = (body: unknown): FleetFile => readFleetFile(JSON.stringify(body));

describe('importFleet', () => {
  let db: TestDatabase;
  let prisma: PrismaClient;
  beforeAll(async () => {
    db = await createMigratedDatabase();
    prisma = createPrisma(db.url);
  });
  afterAll(async () => {
    await prisma?.$disconnect();
    await db?.drop();
  });

  it('creates what is new', async () => {
    const summary = await importFleet(prisma, file(base));
    expect(summary).toEqual({
      vessels: { created: ['imp-alpha', 'imp-bravo'], updated: [], unchanged: [] },
      campaigns: { created: ['imp-camp'], updated: [], unchanged: [] },
    });
    const t2 = await prisma.thruster.findFirstOrThrow({ where: { unitId: 'T2', vessel: { key: 'imp-alpha' } } });
    expect(t2).toMatchObject({ lifeExponent: 3.333, diameterM: null, wearHAtInstall: 0 });
  });

  it('changes nothing when the same file is imported again', async () => {
    const snapshot = async () =>
      (await db.pool.query(`SELECT v.*, (SELECT json_agg(t ORDER BY unit_id) FROM thruster t WHERE t.vessel_id = v.id) AS th FROM vessel v ORDER BY key`)).rows;
    const before = await snapshot();
    const summary = await importFleet(prisma, file(base));
    expect(summary.vessels).toEqual({ created: [], updated: [], unchanged: ['imp-alpha', 'imp-bravo'] });
    expect(summary.campaigns.unchanged).toEqual(['imp-camp']);
    expect(await snapshot()).toEqual(before);
  });

  it('updates what changed, removes units no longer listed and keeps telemetry', async () => {
    const alpha = await prisma.vessel.findUniqueOrThrow({ where: { key: 'imp-alpha' } });
    await db.pool.query(
      `INSERT INTO ts_thruster (vessel_id, unit_id, t, dt, run_s, starts) VALUES ($1, 'T2', now(), 60, 60, 0)`,
      [alpha.id],
    );
    const changed = structuredClone(base);
    changed.vessels[0]!.name = 'Imp Alpha II';
    changed.vessels[0]!.thrusters = [changed.vessels[0]!.thrusters[0]!];
    changed.campaigns[0]!.vessels = ['imp-alpha', 'imp-bravo'];
    const summary = await importFleet(prisma, file(changed));
    expect(summary.vessels).toEqual({ created: [], updated: ['imp-alpha'], unchanged: ['imp-bravo'] });
    expect(summary.campaigns.updated).toEqual(['imp-camp']);
    const units = await prisma.thruster.findMany({ where: { vesselId: alpha.id } });
    expect(units.map((u) => u.unitId)).toEqual(['T1']);
    const kept = await db.pool.query(`SELECT count(*)::int AS n FROM ts_thruster WHERE vessel_id = $1`, [alpha.id]);
    expect(kept.rows[0].n).toBe(1);
    const members = await prisma.campaignVessel.count({ where: { campaign: { key: 'imp-camp' } } });
    expect(members).toBe(2);
  });
});
