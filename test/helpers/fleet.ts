import { randomBytes } from 'node:crypto';
import { createPrisma } from '../../lib/db/prisma';
import { readFleetFile, type FleetFile } from '../../lib/register/fleetFile';
import { importFleet } from '../../lib/register/importFleet';

/** A short unique suffix so tests sharing a broker or server never collide. */
export const uniqueSuffix = () => randomBytes(3).toString('hex');

/** A one-vessel register: two thrusters, two buses, two reference systems. */
export function smallFleet(key: string): FleetFile {
  return readFleetFile(
    JSON.stringify({
      v: 1,
      vessels: [
        {
          key,
          name: `Test ${key}`,
          type: 'supply',
          dp_class: 2,
          watch_circles_m: [3, 5],
          heading_limits_deg: [3, 5],
          thrusters: [
            { id: 'T1', kind: 'tunnel', rated_kw: 900, diameter_m: 1.8, service_interval_h: 20000 },
            { id: 'T2', kind: 'azimuth', rated_kw: 1500, diameter_m: 2.4, service_interval_h: 20000 },
          ],
          buses: [{ id: 'A', rated_kw: 3000 }, { id: 'B', rated_kw: 3000 }],
          refs: [{ id: 'GNSS1', kind: 'gnss' }, { id: 'HPR1', kind: 'hydroacoustic' }],
        },
      ],
    }),
  );
}

export async function registerFleet(url: string, file: FleetFile): Promise<void> {
  const prisma = createPrisma(url);
  try {
    await importFleet(prisma, file);
  } finally {
    await prisma.$disconnect();
  }
}
