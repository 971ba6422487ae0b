import type { Pool } from 'pg';
import { writeAudit, type AuditActor } from './audit';
import { inTransaction, type Queryable } from './db';
import { ensureOrganisation } from './organisations';
import { DEFAULT_SCRYPT, hashPassword, type ScryptParams } from './password';
import { passwordProblem } from './passwordPolicy';
import { isRole, ROLES, type Role } from './roles';
import { revokeAllSessions } from './sessions';

/**
 * Users: created by `holdfast user create` (and, later, the admin pages),
 * disabled rather than deleted so the audit log keeps naming them. Every
 * change is audited. No default password exists outside demo mode: the first
 * admin is created on the command line.
 */

/** A request that cannot be met (bad e-mail, weak password, …): one line for the user. */
export class UserInputError extends Error {}

/** Enough of RFC 5322 to catch typing mistakes; delivery is not Holdfast's business (common practice, no source). */
const EMAIL = /^[^\s@]{1,64}@[^\s@]+\.[^\s@]+$/;

export function normaliseEmail(email: string): string {
  return email.trim().toLowerCase();
}

export interface NewUser {
  email: string;
  displayName: string;
  role: string;
  /** Required for a charterer, refused for the other roles; created when missing. */
  organisationKey?: string;
  password: string;
}

export interface CreatedUser {
  id: number;
  email: string;
  role: Role;
  organisation: { key: string; id: number; created: boolean } | null;
}

export async function createUser(
  pool: Pool,
  input: NewUser,
  options: { actor: AuditActor; scrypt?: ScryptParams },
): Promise<CreatedUser> {
  const email = normaliseEmail(input.email);
  if (!EMAIL.test(email) || email.length > 254) throw new UserInputError(`"${input.email.slice(0, 80)}" is not an e-mail address`);
  const displayName = input.displayName.trim();
  if (displayName.length < 1 || displayName.length > 100) throw new UserInputError('the name must be 1 to 100 characters');
  if (!isRole(input.role)) throw new UserInputError(`the role must be one of ${ROLES.join(', ')} (got "${input.role}")`);
  const role = input.role;
  if (role === 'charterer' && !input.organisationKey) throw new UserInputError('a charterer needs an organisation (--organisation KEY)');
  if (role !== 'charterer' && input.organisationKey) throw new UserInputError('only a charterer belongs to an organisation');
  const problem = passwordProblem(input.password, { email, displayName });
  if (problem) throw new UserInputError(problem);
  // Hash before the transaction: it takes a while and needs no lock.
  const passwordHash = await hashPassword(input.password, options.scrypt ?? DEFAULT_SCRYPT);

  return inTransaction(pool, async (db) => {
    const taken = await db.query('SELECT 1 FROM app_user WHERE lower(email) = $1', [email]);
    if (taken.rowCount) throw new UserInputError(`a user with the e-mail address ${email} exists`);
    const organisation = input.organisationKey ? { key: input.organisationKey, ...(await ensureOrganisation(db, input.organisationKey)) } : null;
    const { rows } = await db.query<{ id: number }>(
      `INSERT INTO app_user (email, display_name, role, organisation_id, password_hash) VALUES ($1, $2, $3, $4, $5) RETURNING id`,
      [email, displayName, role, organisation?.id ?? null, passwordHash],
    );
    const id = rows[0]!.id;
    await writeAudit(db, {
      actor: options.actor,
      action: 'user.create',
      subject: email,
      detail: { userId: id, role, organisation: organisation?.key ?? null, organisationCreated: organisation?.created ?? false },
    });
    return { id, email, role, organisation };
  });
}

export interface UserListing {
  id: number;
  email: string;
  displayName: string;
  role: Role;
  organisation: string | null;
  createdAt: Date;
  lastSignInAt: Date | null;
  disabledAt: Date | null;
  canSignIn: boolean;
}

export async function listUsers(db: Queryable): Promise<UserListing[]> {
  const { rows } = await db.query<UserListing>(
    `SELECT u.id, u.email, u.display_name AS "displayName", u.role, o.key AS organisation, u.created_at AS "createdAt",
            u.last_sign_in_at AS "lastSignInAt", u.disabled_at AS "disabledAt",
            (u.password_hash IS NOT NULL AND u.disabled_at IS NULL) AS "canSignIn"
       FROM app_user u LEFT JOIN organisation o ON o.id = u.organisation_id
      ORDER BY u.id`,
  );
  return rows;
}

/** Set a new password; every session of the user ends except `keepSession` (OWASP Session Management Cheat Sheet: renew on privilege change). */
export async function setUserPassword(
  pool: Pool,
  userId: number,
  password: string,
  options: { actor: AuditActor; keepSession?: string; scrypt?: ScryptParams },
): Promise<void> {
  const { rows } = await pool.query<{ email: string; display_name: string }>('SELECT email, display_name FROM app_user WHERE id = $1', [userId]);
  if (!rows[0]) throw new UserInputError(`no user has the id ${userId}`);
  const problem = passwordProblem(password, { email: rows[0].email, displayName: rows[0].display_name });
  if (problem) throw new UserInputError(problem);
  const passwordHash = await hashPassword(password, options.scrypt ?? DEFAULT_SCRYPT);
  await inTransaction(pool, async (db) => {
    await db.query('UPDATE app_user SET password_hash = $2 WHERE id = $1', [userId, passwordHash]);
    const revoked = await revokeAllSessions(db, userId, { except: options.keepSession });
    await writeAudit(db, { actor: options.actor, action: 'user.set_password', subject: rows[0]!.email, detail: { userId, sessionsRevoked: revoked } });
  });
}

/** Disable a user: no more sign-ins, every session ends at once. False when no such enabled user. */
export async function disableUser(pool: Pool, email: string, options: { actor: AuditActor }): Promise<boolean> {
  const address = normaliseEmail(email);
  return inTransaction(pool, async (db) => {
    const { rows } = await db.query<{ id: number }>(
      'UPDATE app_user SET disabled_at = now() WHERE lower(email) = $1 AND disabled_at IS NULL RETURNING id',
      [address],
    );
    if (!rows[0]) return false;
    const revoked = await revokeAllSessions(db, rows[0].id);
    await writeAudit(db, { actor: options.actor, action: 'user.disable', subject: address, detail: { userId: rows[0].id, sessionsRevoked: revoked } });
    return true;
  });
}
