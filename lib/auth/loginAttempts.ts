import type { Queryable } from './db';
import { accountKey, decideRate, LOGIN_RATE_LIMIT, UNKNOWN_ADDRESS, type RateDecision, type RateLimitPolicy } from './rateLimitPolicy';

/**
 * The database half of the sign-in rate limits (the rule is in
 * rateLimitPolicy.ts). An attempt is recorded before its password is
 * checked, as 'pending', and counted like a failure until it is settled: two
 * web processes checking the same account at the same moment then each see
 * the other's attempt, and neither can slip past the limit. Settled attempts
 * become 'success' or 'failure'; refused ones 'limited'.
 */

export interface AttemptStart {
  id: number;
  decision: RateDecision;
}

// The failures counted against the account (since its last success) and
// against the address, newest first, each at most `limit` rows.
const COUNT_SQL = `
  WITH last_success AS (
    SELECT max(at) AS at FROM login_attempt WHERE email = $1 AND outcome = 'success' AND at > $3
  )
  SELECT
    ARRAY(SELECT at FROM login_attempt
           WHERE email = $1 AND id <> $4 AND outcome IN ('pending', 'failure') AND at > $3
             AND at > coalesce((SELECT at FROM last_success), '-infinity')
           ORDER BY at DESC LIMIT $5) AS account,
    ARRAY(SELECT at FROM login_attempt
           WHERE ip_key = $2 AND id <> $4 AND outcome IN ('pending', 'failure') AND at > $3
           ORDER BY at DESC LIMIT $6) AS address`;

export async function beginLoginAttempt(
  db: Queryable,
  input: { email: string; addressKey: string; now?: Date },
  policy: RateLimitPolicy = LOGIN_RATE_LIMIT,
): Promise<AttemptStart> {
  const now = input.now ?? new Date();
  const email = accountKey(input.email);
  const inserted = await db.query<{ id: number }>(
    'INSERT INTO login_attempt (at, email, ip_key) VALUES ($1, $2, $3) RETURNING id',
    [now, email, input.addressKey],
  );
  const id = Number(inserted.rows[0]!.id);
  const since = new Date(now.getTime() - policy.windowMs);
  const { rows } = await db.query<{ account: Date[]; address: Date[] }>(COUNT_SQL, [
    email,
    input.addressKey,
    since,
    id,
    policy.perAccount,
    policy.perAddress,
  ]);
  // An unknown address is no one's: counting all of them together would let anyone lock every
  // sign-in out with 50 wrong passwords. Those attempts meet the per-account limit only.
  const address = input.addressKey === UNKNOWN_ADDRESS ? [] : rows[0]!.address;
  const decision = decideRate({ account: rows[0]!.account, address }, now, policy);
  if (!decision.allowed) await settleLoginAttempt(db, id, 'limited');
  return { id, decision };
}

export async function settleLoginAttempt(db: Queryable, id: number, outcome: 'success' | 'failure' | 'limited'): Promise<void> {
  await db.query('UPDATE login_attempt SET outcome = $2 WHERE id = $1', [id, outcome]);
}

/** Delete attempts older than a day: the windows are 15 minutes, the audit log keeps the sign-ins. */
export async function pruneLoginAttempts(db: Queryable, now = new Date()): Promise<number> {
  const { rowCount } = await db.query('DELETE FROM login_attempt WHERE at < $1', [new Date(now.getTime() - 24 * 3600_000)]);
  return rowCount ?? 0;
}
