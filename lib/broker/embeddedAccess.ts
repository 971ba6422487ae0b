import { createHash, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Queryable } from '../auth/db';
import { findLiveCredential, stillLive } from './credentials';
import { verifyMosquittoPassword } from './passwordHash';
import type { BrokerRole } from './topicAccess';

/**
 * Who may connect to the embedded broker: the credentials in the store
 * (vessels and the ingest workers, exactly those `holdfast broker export`
 * writes for Mosquitto) plus "local" credentials that live only in the
 * memory of the process that started the broker — made afresh at each start
 * for the ingest worker and the demo publisher of `npm start`, so the demo
 * runs with zero settings and no password is ever written down.
 */

export interface ClientGrant {
  username: string;
  role: BrokerRole;
  /** The stored credential, re-checked while connected; null for a local one. */
  credentialId: number | null;
}

export interface BrokerAccess {
  topicRoot: string;
  /** The grant for these credentials, or null to refuse them. Throws when it cannot tell (store down). */
  authenticate(username: string, password: string): Promise<ClientGrant | null>;
  /** Which of these stored credentials are still live. */
  stillLive(credentialIds: readonly number[]): Promise<Set<number>>;
  /** How often connected clients with stored credentials are re-checked, in ms (0: never). */
  recheckEveryMs: number;
}

export interface LocalCredential {
  username: string;
  password: string;
  role: BrokerRole;
}

/**
 * Fresh local credentials for one start: usernames no stored credential can
 * have (they start with "holdfast_local_"), passwords of 32 random bytes.
 */
export function localCredentials(): { ingest: LocalCredential; publisher: LocalCredential } {
  const password = () => randomBytes(32).toString('base64url');
  return {
    ingest: { username: 'holdfast_local_ingest', password: password(), role: { kind: 'ingest' } },
    publisher: { username: 'holdfast_local_demo', password: password(), role: { kind: 'publisher' } },
  };
}

/** Equal strings in constant time (their SHA-256 digests have equal length, whatever the inputs). */
function sameSecret(a: string, b: string): boolean {
  const digest = (s: string) => createHash('sha256').update(s, 'utf8').digest();
  return timingSafeEqual(digest(a), digest(b));
}

/** Revocation takes effect on connected clients within this long (common practice, no source). */
export const RECHECK_EVERY_MS = 60_000;

export function storeBrokerAccess(
  db: Queryable,
  options: { topicRoot: string; local?: readonly LocalCredential[]; recheckEveryMs?: number },
): BrokerAccess {
  const local = options.local ?? [];
  return {
    topicRoot: options.topicRoot,
    recheckEveryMs: options.recheckEveryMs ?? RECHECK_EVERY_MS,
    async authenticate(username, password) {
      const mine = local.find((c) => c.username === username);
      if (mine) return sameSecret(password, mine.password) ? { username, role: mine.role, credentialId: null } : null;
      if (username.startsWith('holdfast_local_')) return null;
      const stored = await findLiveCredential(db, username);
      if (!stored || !(await verifyMosquittoPassword(password, stored.passwordHash))) return null;
      if (stored.kind === 'vessel') {
        // A live vessel credential always has its vessel (ON DELETE CASCADE); refuse rather than guess.
        if (!stored.vesselKey) return null;
        return { username, role: { kind: 'vessel', vesselKey: stored.vesselKey }, credentialId: stored.id };
      }
      return { username, role: { kind: 'ingest' }, credentialId: stored.id };
    },
    stillLive: (ids) => stillLive(db, ids),
  };
}
