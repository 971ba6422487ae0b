import { loadConfig } from '../config';
import { createPrisma, type PrismaClient } from '../db/prisma';

/**
 * The web app's one Prisma client (relational writes: flag lifecycle,
 * register import), created on first use from DATABASE_URL. Kept on
 * globalThis, like the pg pool (lib/db/sharedPool.ts), so `next dev`'s
 * module reloads reuse it instead of opening new connections each time.
 */
const holder = globalThis as typeof globalThis & { __holdfastSharedPrisma?: PrismaClient };

export function getSharedPrisma(): PrismaClient {
  if (holder.__holdfastSharedPrisma) return holder.__holdfastSharedPrisma;
  const url = loadConfig().DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is not set: the web app writes to the store it names');
  holder.__holdfastSharedPrisma = createPrisma(url);
  return holder.__holdfastSharedPrisma;
}
