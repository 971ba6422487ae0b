import { createHmac } from 'node:crypto';
import type { Pool } from 'pg';
import { retryDelaySeconds } from './backoff';

/**
 * Sends the outbox (flag_outbox) to the webhooks: each due row is leased
 * (its next attempt moved LEASE_S ahead and its attempt counted) in a short
 * transaction with SKIP LOCKED, so several job processes never send the same
 * row at once and no lock is held during the HTTP request; then POSTed; then
 * marked delivered, or given its next attempt time (backoff.ts). A process
 * that dies mid-request leaves the row to be retried when the lease ends.
 *
 * Delivery is at least once: a receiver that answered 2xx after our timeout
 * gets the flag again. Each request carries `X-Holdfast-Delivery` (the
 * outbox id, the same on every retry) and the flag id in the body, so a
 * receiver can drop repeats; and, when the webhook has a secret,
 * `X-Holdfast-Signature: sha256=<hex HMAC-SHA256 of the body>` (the scheme
 * GitHub's webhooks use).
 */

export const LEASE_S = 120;
export const REQUEST_TIMEOUT_MS = 10_000;
export const BATCH = 50;

export interface DeliveryReport {
  attempted: number;
  delivered: number;
  failed: number;
}

interface Leased {
  id: string;
  payload: unknown;
  attempts: number;
  url: string;
  secret: string | null;
}

async function leaseDue(pool: Pool, now: Date, limit: number): Promise<Leased[]> {
  const { rows } = await pool.query<Leased>(
    `UPDATE flag_outbox o SET next_attempt_at = $1::timestamptz + make_interval(secs => $3), attempts = o.attempts + 1
       FROM flag_webhook w
      WHERE w.id = o.webhook_id
        AND o.id IN (SELECT x.id FROM flag_outbox x JOIN flag_webhook y ON y.id = x.webhook_id
                      WHERE x.delivered_at IS NULL AND x.next_attempt_at <= $1 AND y.enabled
                      ORDER BY x.id LIMIT $2 FOR UPDATE OF x SKIP LOCKED)
      RETURNING o.id, o.payload, o.attempts, w.url, w.secret`,
    [now, limit, LEASE_S],
  );
  return rows.sort((a, b) => Number(a.id) - Number(b.id));
}

async function post(row: Leased): Promise<string | null> {
  const body = JSON.stringify(row.payload);
  const headers: Record<string, string> = {
    'content-type': 'application/json',
    'user-agent': 'holdfast-flags',
    'x-holdfast-event': 'flag.opened',
    'x-holdfast-delivery': String(row.id),
  };
  if (row.secret) headers['x-holdfast-signature'] = `sha256=${createHmac('sha256', row.secret).update(body).digest('hex')}`;
  try {
    const response = await fetch(row.url, { method: 'POST', headers, body, signal: AbortSignal.timeout(REQUEST_TIMEOUT_MS), redirect: 'error' });
    // Read the body so the connection is released; its content does not matter.
    await response.arrayBuffer().catch(() => undefined);
    return response.ok ? null : `HTTP ${response.status}`;
  } catch (error) {
    const e = error as Error & { cause?: { code?: string; message?: string } };
    return e.cause?.code ?? e.cause?.message ?? e.message;
  }
}

/** Send every row due at `now` (batch after batch); failures are rescheduled, never dropped. */
export async function deliverDue(pool: Pool, now = new Date()): Promise<DeliveryReport> {
  const report: DeliveryReport = { attempted: 0, delivered: 0, failed: 0 };
  const seen = new Set<string>();
  const downUntil = new Map<string, Date>();
  for (;;) {
    const rows = (await leaseDue(pool, now, BATCH)).filter((r) => !seen.has(r.id));
    if (rows.length === 0) return report;
    for (const row of rows) {
      seen.add(row.id);
      const down = downUntil.get(row.url);
      if (down) {
        // Its webhook already failed in this run: do not knock again now, and do not count this as an attempt.
        await pool.query('UPDATE flag_outbox SET next_attempt_at = $2, attempts = attempts - 1 WHERE id = $1', [row.id, down]);
        continue;
      }
      report.attempted++;
      const error = await post(row);
      if (error === null) {
        report.delivered++;
        await pool.query('UPDATE flag_outbox SET delivered_at = now(), last_error = NULL WHERE id = $1', [row.id]);
      } else {
        report.failed++;
        const retryAt = new Date(now.getTime() + retryDelaySeconds(row.attempts) * 1000);
        downUntil.set(row.url, retryAt);
        await pool.query('UPDATE flag_outbox SET next_attempt_at = $2, last_error = $3 WHERE id = $1', [row.id, retryAt, error.slice(0, 500)]);
      }
    }
  }
}
