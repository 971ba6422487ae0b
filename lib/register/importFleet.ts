import type { PrismaClient } from '../db/prisma';
import { comparableCampaign, comparableVessel } from './comparable';
import type { FleetFile, FleetVessel } from './fleetFile';

export interface ChangeList {
  created: string[];
  updated: string[];
  unchanged: string[];
}
export interface ImportSummary {
  vessels: ChangeList;
  campaigns: ChangeList;
}

type Tx = Parameters<Parameters<PrismaClient['$transaction']>[0]>[0];

const emptyChanges = (): ChangeList => ({ created: [], updated: [], unchanged: [] });
const dayOf = (d: Date) => d.toISOString().slice(0, 10);
const asDate = (day: string) => new Date(`${day}T00:00:00Z`);
const byId = <T extends { id: string }>(a: T, b: T) => a.id.localeCompare(b.id);

async function storedVessel(tx: Tx, key: string) {
  const v = await tx.vessel.findUnique({ where: { key }, include: { thrusters: true, buses: true, refSystems: true } });
  if (!v) return undefined;
  return {
    id: v.id,
    state: {
      name: v.name,
      type: v.type,
      dp_class: v.dpClass,
      watch_circles_m: v.watchCirclesM,
      heading_limits_deg: v.headingLimitsDeg,
      thrusters: v.thrusters
        .map((t) => ({
          id: t.unitId,
          kind: t.kind,
          rated_kw: t.ratedKw,
          diameter_m: t.diameterM,
          life_exponent: t.lifeExponent,
          service_interval_h: t.serviceIntervalH,
          wear_h_at_install: t.wearHAtInstall,
        }))
        .sort(byId),
      buses: v.buses.map((b) => ({ id: b.unitId, rated_kw: b.ratedKw })).sort(byId),
      refs: v.refSystems.map((r) => ({ id: r.unitId, kind: r.kind })).sort(byId),
    },
  };
}

/** Stable JSON: key order must not make equal states look different. */
function same(a: unknown, b: unknown): boolean {
  const canon = (x: unknown): unknown =>
    Array.isArray(x)
      ? x.map(canon)
      : x && typeof x === 'object'
        ? Object.fromEntries(Object.entries(x).sort(([k1], [k2]) => k1.localeCompare(k2)).map(([k, v]) => [k, canon(v)]))
        : x;
  return JSON.stringify(canon(a)) === JSON.stringify(canon(b));
}

async function writeVessel(tx: Tx, v: FleetVessel, existingId?: number): Promise<void> {
  const fields = {
    name: v.name,
    type: v.type,
    dpClass: v.dp_class,
    watchCirclesM: v.watch_circles_m,
    headingLimitsDeg: v.heading_limits_deg,
  };
  const id = existingId
    ? (await tx.vessel.update({ where: { id: existingId }, data: { ...fields, updatedAt: new Date() } })).id
    : (await tx.vessel.create({ data: { key: v.key, ...fields } })).id;

  // Units no longer listed leave the register; their stored telemetry stays.
  await tx.thruster.deleteMany({ where: { vesselId: id, unitId: { notIn: v.thrusters.map((t) => t.id) } } });
  await tx.bus.deleteMany({ where: { vesselId: id, unitId: { notIn: v.buses.map((b) => b.id) } } });
  await tx.refSystem.deleteMany({ where: { vesselId: id, unitId: { notIn: v.refs.map((r) => r.id) } } });
  for (const t of v.thrusters) {
    const data = {
      kind: t.kind,
      ratedKw: t.rated_kw,
      diameterM: t.diameter_m ?? null,
      lifeExponent: t.life_exponent,
      serviceIntervalH: t.service_interval_h,
      wearHAtInstall: t.wear_h_at_install,
    };
    await tx.thruster.upsert({
      where: { vesselId_unitId: { vesselId: id, unitId: t.id } },
      create: { vesselId: id, unitId: t.id, ...data },
      update: data,
    });
  }
  for (const b of v.buses) {
    await tx.bus.upsert({
      where: { vesselId_unitId: { vesselId: id, unitId: b.id } },
      create: { vesselId: id, unitId: b.id, ratedKw: b.rated_kw },
      update: { ratedKw: b.rated_kw },
    });
  }
  for (const r of v.refs) {
    await tx.refSystem.upsert({
      where: { vesselId_unitId: { vesselId: id, unitId: r.id } },
      create: { vesselId: id, unitId: r.id, kind: r.kind },
      update: { kind: r.kind },
    });
  }
}

/**
 * Bring the register in line with a validated file, in one transaction.
 * Importing the same file twice changes nothing. Vessels and campaigns not in
 * the file are left alone; nothing here touches stored telemetry.
 */
export async function importFleet(prisma: PrismaClient, file: FleetFile): Promise<ImportSummary> {
  return prisma.$transaction(
    async (tx) => {
      const summary: ImportSummary = { vessels: emptyChanges(), campaigns: emptyChanges() };
      const vesselIds = new Map<string, number>();
      for (const v of file.vessels) {
        const stored = await storedVessel(tx, v.key);
        if (stored && same(stored.state, comparableVessel(v))) {
          summary.vessels.unchanged.push(v.key);
        } else {
          await writeVessel(tx, v, stored?.id);
          summary.vessels[stored ? 'updated' : 'created'].push(v.key);
        }
        vesselIds.set(v.key, (await tx.vessel.findUniqueOrThrow({ where: { key: v.key } })).id);
      }

      for (const c of file.campaigns) {
        const wanted = comparableCampaign(c);
        const stored = await tx.campaign.findUnique({ where: { key: c.key }, include: { vessels: { include: { vessel: true } } } });
        const current = stored && {
          charterer: stored.charterer,
          from: dayOf(stored.fromDay),
          to: dayOf(stored.toDay),
          site: { name: stored.siteName, lat: stored.siteLat, lon: stored.siteLon },
          watch_circles_m: stored.watchCirclesM,
          vessels: stored.vessels.map((cv) => cv.vessel.key).sort(),
        };
        if (current && same(current, wanted)) {
          summary.campaigns.unchanged.push(c.key);
          continue;
        }
        const data = {
          charterer: c.charterer,
          fromDay: asDate(c.from),
          toDay: asDate(c.to),
          siteName: c.site.name,
          siteLat: c.site.lat,
          siteLon: c.site.lon,
          watchCirclesM: c.watch_circles_m,
        };
        const campaign = await tx.campaign.upsert({ where: { key: c.key }, create: { key: c.key, ...data }, update: data });
        await tx.campaignVessel.deleteMany({ where: { campaignId: campaign.id } });
        await tx.campaignVessel.createMany({
          data: c.vessels.map((key) => ({ campaignId: campaign.id, vesselId: vesselIds.get(key)! })),
        });
        summary.campaigns[stored ? 'updated' : 'created'].push(c.key);
      }
      return summary;
    },
    { timeout: 120_000, maxWait: 30_000 },
  );
}
