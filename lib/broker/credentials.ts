import type { Pool } from 'pg';
import { writeAudit, type AuditActor } from '../auth/audit';
import { inTransaction, type Queryable } from '../auth/db';
import { generateMqttPassword, hashMosquittoPassword } from './passwordHash';

/**
 * MQTT credentials in the store (mqtt_credential): one live per vessel, its
 * username the vessel key; one live for the ingest workers. Made by
 * `holdfast vessel credentials KEY` and `holdfast broker ingest-credentials`;
 * the password is returned once and only its hash is kept. Making new
 * credentials revokes the previous ones in the same transaction, so a
 * vessel never has two live passwords.
 */

/** The ingest workers' username. It has a "_", which no vessel key has, so it cannot be a vessel's. */
export const INGEST_USERNAME = 'holdfast_ingest';

export class CredentialInputError extends Error {}

export interface IssuedCredential {
  id: number;
  username: string;
  /** Shown once; the store keeps only its hash. */
  password: string;
}

export async function createVesselCredential(pool: Pool, vesselKey: string, actor: AuditActor): Promise<IssuedCredential> {
  const password = generateMqttPassword();
  const hash = await hashMosquittoPassword(password);
  return inTransaction(pool, async (db) => {
    // Lock the vessel row: two concurrent runs for one vessel take turns.
    const vessel = await db.query<{ id: number }>('SELECT id FROM vessel WHERE key = $1 FOR UPDATE', [vesselKey]);
    if (!vessel.rows[0]) throw new CredentialInputError(`no vessel has the key "${vesselKey.slice(0, 64)}"`);
    const vesselId = vessel.rows[0].id;
    const revoked = await db.query('UPDATE mqtt_credential SET revoked_at = now() WHERE vessel_id = $1 AND revoked_at IS NULL', [vesselId]);
    const { rows } = await db.query<{ id: number }>(
      `INSERT INTO mqtt_credential (kind, vessel_id, username, password_hash) VALUES ('vessel', $1, $2, $3) RETURNING id`,
      [vesselId, vesselKey, hash],
    );
    await writeAudit(db, { actor, action: 'mqtt_credential.create', subject: vesselKey, detail: { kind: 'vessel', credentialId: rows[0]!.id, replaced: revoked.rowCount ?? 0 } });
    return { id: rows[0]!.id, username: vesselKey, password };
  });
}

export async function createIngestCredential(pool: Pool, actor: AuditActor): Promise<IssuedCredential> {
  const password = generateMqttPassword();
  const hash = await hashMosquittoPassword(password);
  return inTransaction(pool, async (db) => {
    // Serialise concurrent rotations on the one ingest username.
    await db.query('SELECT pg_advisory_xact_lock(hashtext($1))', [INGEST_USERNAME]);
    const revoked = await db.query(`UPDATE mqtt_credential SET revoked_at = now() WHERE kind = 'ingest' AND revoked_at IS NULL`);
    const { rows } = await db.query<{ id: number }>(
      `INSERT INTO mqtt_credential (kind, username, password_hash) VALUES ('ingest', $1, $2) RETURNING id`,
      [INGEST_USERNAME, hash],
    );
    await writeAudit(db, { actor, action: 'mqtt_credential.create', subject: INGEST_USERNAME, detail: { kind: 'ingest', credentialId: rows[0]!.id, replaced: revoked.rowCount ?? 0 } });
    return { id: rows[0]!.id, username: INGEST_USERNAME, password };
  });
}

/** Revoke a vessel's live credentials: it can no longer connect. False when it had none. */
export async function revokeVesselCredential(pool: Pool, vesselKey: string, actor: AuditActor): Promise<boolean> {
  return inTransaction(pool, async (db) => {
    const { rowCount } = await db.query(
      `UPDATE mqtt_credential SET revoked_at = now()
        WHERE revoked_at IS NULL AND vessel_id = (SELECT id FROM vessel WHERE key = $1)`,
      [vesselKey],
    );
    if (!rowCount) return false;
    await writeAudit(db, { actor, action: 'mqtt_credential.revoke', subject: vesselKey, detail: { kind: 'vessel' } });
    return true;
  });
}

export interface LiveCredential {
  id: number;
  kind: 'vessel' | 'ingest';
  username: string;
  /** The vessel key for a vessel credential. */
  vesselKey: string | null;
  passwordHash: string;
}

const LIVE_SQL = `
  SELECT m.id, m.kind, m.username, v.key AS "vesselKey", m.password_hash AS "passwordHash"
    FROM mqtt_credential m LEFT JOIN vessel v ON v.id = m.vessel_id
   WHERE m.revoked_at IS NULL`;

/** The live credential of `username`, if any. */
export async function findLiveCredential(db: Queryable, username: string): Promise<LiveCredential | null> {
  const { rows } = await db.query<LiveCredential>(`${LIVE_SQL} AND m.username = $1`, [username]);
  return rows[0] ?? null;
}

/** Every live credential, by username (what `holdfast broker export` writes). */
export async function listLiveCredentials(db: Queryable): Promise<LiveCredential[]> {
  const { rows } = await db.query<LiveCredential>(`${LIVE_SQL} ORDER BY m.username`);
  return rows;
}

/** Which of `ids` are still live (the embedded broker drops connections of the others). */
export async function stillLive(db: Queryable, ids: readonly number[]): Promise<Set<number>> {
  if (ids.length === 0) return new Set();
  const { rows } = await db.query<{ id: number }>('SELECT id FROM mqtt_credential WHERE id = ANY($1::int[]) AND revoked_at IS NULL', [ids]);
  return new Set(rows.map((r) => r.id));
}
