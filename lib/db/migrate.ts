import { Umzug, type UmzugStorage } from 'umzug';
import type { SqlExecutor } from './executor';
import { DEFAULT_MIGRATIONS_DIR, loadMigrationFiles, type StoreFlavour } from './migrationFiles';

export type StoreChoice = 'auto' | StoreFlavour;

export interface MigrateOptions {
  store: StoreChoice;
  dir?: string;
  log?: (line: string) => void;
}

export interface MigrateResult {
  flavour: StoreFlavour;
  applied: string[];
}

/** Any fixed number: all Holdfast processes serialise migrations on it. */
const MIGRATION_LOCK = 7_244_051;

const BOOTSTRAP = `
  CREATE TABLE IF NOT EXISTS holdfast_store (
    only_row    boolean PRIMARY KEY DEFAULT true CHECK (only_row),
    flavour     text NOT NULL CHECK (flavour IN ('timescale', 'partitions')),
    chosen_at   timestamptz NOT NULL DEFAULT now()
  );
  CREATE TABLE IF NOT EXISTS holdfast_migration (
    name        text PRIMARY KEY,
    checksum    text NOT NULL,
    applied_at  timestamptz NOT NULL DEFAULT now()
  );`;

/**
 * Bring the store up to date. Safe to run again (a no-op when nothing is
 * pending) and from several processes at once (an advisory lock serialises
 * them). All pending migrations apply in one transaction: either all or none.
 * The store flavour is chosen on the first run and recorded; later runs keep it.
 */
export async function migrate(db: SqlExecutor, options: MigrateOptions): Promise<MigrateResult> {
  const log = options.log ?? (() => {});
  await db.query('SELECT pg_advisory_lock($1)', [MIGRATION_LOCK]);
  try {
    await db.exec(BOOTSTRAP);
    const flavour = await chooseFlavour(db, options.store, log);
    const files = loadMigrationFiles(flavour, options.dir ?? DEFAULT_MIGRATIONS_DIR);
    await verifyChecksums(db, files);

    const umzug = new Umzug({
      migrations: files.map((file) => ({
        name: file.name,
        up: async () => {
          await db.exec(file.sql);
          await db.query('INSERT INTO holdfast_migration (name, checksum) VALUES ($1, $2)', [file.name, file.checksum]);
        },
      })),
      storage: appliedMigrations(db),
      logger: undefined,
    });

    await db.exec('BEGIN');
    try {
      const applied = await umzug.up();
      await db.exec('COMMIT');
      for (const m of applied) log(`migrated ${m.name} (${flavour})`);
      return { flavour, applied: applied.map((m) => m.name) };
    } catch (error) {
      await db.exec('ROLLBACK');
      throw error;
    }
  } finally {
    await db.query('SELECT pg_advisory_unlock($1)', [MIGRATION_LOCK]);
  }
}

/** Applied migrations are recorded by each migration's own `up`, inside the transaction. */
function appliedMigrations(db: SqlExecutor): UmzugStorage {
  return {
    async executed() {
      const { rows } = await db.query<{ name: string }>('SELECT name FROM holdfast_migration ORDER BY name');
      return rows.map((r) => r.name);
    },
    async logMigration() {},
    async unlogMigration({ name }) {
      await db.query('DELETE FROM holdfast_migration WHERE name = $1', [name]);
    },
  };
}

async function verifyChecksums(db: SqlExecutor, files: { name: string; checksum: string }[]) {
  const { rows } = await db.query<{ name: string; checksum: string }>('SELECT name, checksum FROM holdfast_migration');
  const byName = new Map(files.map((f) => [f.name, f.checksum]));
  for (const row of rows) {
    const current = byName.get(row.name);
    if (current === undefined) throw new Error(`Migration ${row.name} is applied but its file is missing`);
    if (current !== row.checksum) {
      throw new Error(`Migration ${row.name} was edited after it was applied; add a new migration instead`);
    }
  }
}

async function chooseFlavour(db: SqlExecutor, wanted: StoreChoice, log: (line: string) => void): Promise<StoreFlavour> {
  const { rows } = await db.query<{ flavour: StoreFlavour }>('SELECT flavour FROM holdfast_store');
  const recorded = rows[0]?.flavour;
  if (recorded) {
    if (wanted !== 'auto' && wanted !== recorded) {
      throw new Error(`This store was created with the ${recorded} flavour; HOLDFAST_STORE=${wanted} cannot change it`);
    }
    return recorded;
  }

  let flavour: StoreFlavour = 'partitions';
  if (wanted !== 'partitions') {
    const available = await db.query("SELECT 1 FROM pg_available_extensions WHERE name = 'timescaledb'");
    if (available.rows.length > 0) {
      try {
        await db.exec('CREATE EXTENSION IF NOT EXISTS timescaledb');
        flavour = 'timescale';
      } catch (error) {
        if (wanted === 'timescale') throw error;
        log(`TimescaleDB is installed but could not be enabled (${(error as Error).message}); using native partitions`);
      }
    } else if (wanted === 'timescale') {
      throw new Error('HOLDFAST_STORE=timescale but the timescaledb extension is not available on this server');
    }
  }
  await db.query('INSERT INTO holdfast_store (flavour) VALUES ($1)', [flavour]);
  log(`store flavour: ${flavour}`);
  return flavour;
}
