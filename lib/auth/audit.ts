import type { Queryable } from './db';
import { principalLabel, type Principal } from './principal';

/**
 * The audit log writer: one row per event that changes who may do what or
 * what the record says (sign-ins, flag steps, register imports, users,
 * tokens, credentials). docs/access-control.md lists the actions.
 *
 * OWASP Logging Cheat Sheet: record who, what, when and from where, and never
 * secrets. `detail` is free JSON, so the writer blanks any key that names a
 * secret before storing it, in case a caller passes one by mistake.
 */

/** Who acted: a principal, or the CLI / the system for work without one. */
export type AuditActor = Principal | { kind: 'cli' } | { kind: 'system' } | { kind: 'anonymous'; label: string };

export interface AuditEntry {
  actor: AuditActor;
  /** `area.verb`, e.g. `auth.sign_in`, `flag.acknowledge`, `mqtt_credential.create`. */
  action: string;
  /** What was acted on, e.g. a vessel key, `flag 42`, an e-mail address. */
  subject?: string | null;
  ip?: string | null;
  detail?: Record<string, unknown>;
}

// password, passwordHash, secret, cookie, sessionId, token, csrfToken … (not tokenId or sessionsRevoked).
const SECRET_KEY = /passw(or)?d|secret|hash|cookie|session_?id|^token$|_token$|[a-z]Token$/i;

export function redact(value: unknown): unknown {
  if (Array.isArray(value)) return value.map(redact);
  if (value && typeof value === 'object') {
    return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, SECRET_KEY.test(k) ? '[redacted]' : redact(v)]));
  }
  return value;
}

function actorColumns(actor: AuditActor): { userId: number | null; tokenId: number | null; label: string } {
  switch (actor.kind) {
    case 'user':
    case 'token':
      return { userId: actor.kind === 'user' ? actor.userId : null, tokenId: actor.kind === 'token' ? actor.tokenId : null, label: principalLabel(actor) };
    case 'anonymous':
      return { userId: null, tokenId: null, label: actor.label.slice(0, 320) || 'anonymous' };
    default:
      return { userId: null, tokenId: null, label: actor.kind };
  }
}

export async function writeAudit(db: Queryable, entry: AuditEntry): Promise<void> {
  const actor = actorColumns(entry.actor);
  await db.query(
    `INSERT INTO audit_log (actor_user_id, actor_token_id, actor, action, subject, ip, detail)
     VALUES ($1, $2, $3, $4, $5, $6, $7)`,
    [
      actor.userId,
      actor.tokenId,
      actor.label,
      entry.action,
      entry.subject?.slice(0, 320) ?? null,
      entry.ip?.slice(0, 64) ?? null,
      JSON.stringify(redact(entry.detail ?? {})),
    ],
  );
}

export interface AuditRow {
  id: number;
  at: Date;
  actor: string;
  actorUserId: number | null;
  actorTokenId: number | null;
  action: string;
  subject: string | null;
  ip: string | null;
  detail: Record<string, unknown>;
}

/** The newest entries first (for the admin page and tests). */
export async function readAudit(db: Queryable, options: { limit?: number; action?: string } = {}): Promise<AuditRow[]> {
  const { rows } = await db.query<AuditRow>(
    `SELECT id, at, actor, actor_user_id AS "actorUserId", actor_token_id AS "actorTokenId", action, subject, ip, detail
       FROM audit_log WHERE ($1::text IS NULL OR action = $1) ORDER BY id DESC LIMIT $2`,
    [options.action ?? null, Math.min(Math.max(options.limit ?? 100, 1), 1000)],
  );
  return rows;
}
