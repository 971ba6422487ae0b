import { createHash } from 'node:crypto';
import { readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export type StoreFlavour = 'timescale' | 'partitions';
export const STORE_FLAVOURS: readonly StoreFlavour[] = ['timescale', 'partitions'];

export const DEFAULT_MIGRATIONS_DIR = path.resolve(
  path.dirname(fileURLToPath(import.meta.url)),
  '../../prisma/migrations',
);

export interface MigrationFile {
  /** Recorded name, the same in every flavour: `0002_timeseries`. */
  name: string;
  /** SQL ready to run for the chosen flavour. */
  sql: string;
  /** sha256 of the file as written, to detect edits of applied migrations. */
  checksum: string;
}

const FILE = /^(\d{4}_[a-z0-9_]+)(?:\.(timescale|partitions))?\.sql$/;
const PARTITION_TOKEN = /@PARTITION_BY_TIME@/g;

/**
 * The migrations for one store flavour, in order. A migration is either one
 * `NNNN_name.sql` for every flavour or a pair `NNNN_name.timescale.sql` +
 * `NNNN_name.partitions.sql`. Common files may use @PARTITION_BY_TIME@ where a
 * table is partitioned by time in the plain PostgreSQL flavour.
 */
export function loadMigrationFiles(flavour: StoreFlavour, dir = DEFAULT_MIGRATIONS_DIR): MigrationFile[] {
  const byName = new Map<string, { common?: string; flavoured: Partial<Record<StoreFlavour, string>> }>();
  for (const file of readdirSync(dir).sort()) {
    if (!file.endsWith('.sql')) continue;
    const match = FILE.exec(file);
    if (!match) throw new Error(`Migration file ${file}: name must look like 0001_name.sql or 0001_name.timescale.sql`);
    const [, name, which] = match as unknown as [string, string, StoreFlavour | undefined];
    const entry = byName.get(name) ?? { flavoured: {} };
    if (which) entry.flavoured[which] = file;
    else entry.common = file;
    byName.set(name, entry);
  }

  return [...byName.entries()].map(([name, entry]) => {
    const flavouredFiles = Object.keys(entry.flavoured).length;
    if (entry.common && flavouredFiles > 0) {
      throw new Error(`Migration ${name}: has both a common file and flavour files`);
    }
    if (!entry.common && flavouredFiles !== STORE_FLAVOURS.length) {
      throw new Error(`Migration ${name}: needs one file per store flavour (${STORE_FLAVOURS.join(', ')})`);
    }
    const file = entry.common ?? entry.flavoured[flavour]!;
    const text = readFileSync(path.join(dir, file), 'utf8');
    const partitionClause = flavour === 'partitions' ? 'PARTITION BY RANGE (t)' : '';
    return {
      name,
      sql: text.replace(PARTITION_TOKEN, partitionClause),
      checksum: createHash('sha256').update(text).digest('hex'),
    };
  });
}
