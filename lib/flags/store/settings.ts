import type { Pool } from 'pg';
import { parseFlagSettings, type FlagSettings } from '../config';

/** The flag job's settings row (prisma/migrations/0009_flag_notifications.sql), parsed over the defaults. */

type Queryable = Pick<Pool, 'query'>;

export async function readFlagSettings(db: Queryable): Promise<FlagSettings> {
  const { rows } = await db.query<{ settings: unknown }>('SELECT settings FROM flag_settings WHERE id = 1');
  return parseFlagSettings(rows[0]?.settings ?? {});
}

/** Validate, then store (replacing the previous object). Returns the effective settings. */
export async function writeFlagSettings(db: Queryable, value: unknown): Promise<FlagSettings> {
  const effective = parseFlagSettings(value);
  await db.query(
    `INSERT INTO flag_settings (id, settings, updated_at) VALUES (1, $1::jsonb, now())
     ON CONFLICT (id) DO UPDATE SET settings = EXCLUDED.settings, updated_at = now()`,
    [JSON.stringify(value ?? {})],
  );
  return effective;
}
