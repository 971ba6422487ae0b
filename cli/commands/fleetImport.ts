import { readFileSync } from 'node:fs';
import type { Config } from '../../lib/config';
import { createPrisma } from '../../lib/db/prisma';
import type { Logger } from '../../lib/log/logger';
import { readFleetFile } from '../../lib/register/fleetFile';
import { importFleet, type ChangeList } from '../../lib/register/importFleet';
import { openStore } from '../runtime';

const describe = (what: string, c: ChangeList) =>
  `${what}: ${c.created.length} created${c.created.length ? ` (${c.created.join(', ')})` : ''}, ` +
  `${c.updated.length} updated${c.updated.length ? ` (${c.updated.join(', ')})` : ''}, ${c.unchanged.length} unchanged`;

/** `holdfast fleet import FILE`: validate the whole file first, then apply it in one transaction. */
export async function fleetImportCommand(config: Config, log: Logger, file: string): Promise<void> {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    throw new Error(`cannot read ${file}: ${(error as NodeJS.ErrnoException).code ?? (error as Error).message}`);
  }
  const fleet = readFleetFile(text, file); // throws FleetFileError listing every error
  const store = await openStore(config, log.child('store'));
  const prisma = createPrisma(store.url);
  try {
    const summary = await importFleet(prisma, fleet);
    console.log(describe('vessels', summary.vessels));
    console.log(describe('campaigns', summary.campaigns));
  } finally {
    await prisma.$disconnect();
    await store.close();
  }
}
