import type { Queryable } from '../api/context';
import { listWebhooks, type Webhook } from '../flags/notify/webhooks';

/**
 * Webhooks for the admin page, read with the flag job's own listing
 * (lib/flags/notify/webhooks.ts: URL, whether a secret is set, enabled,
 * deliveries pending and done, the last error). null when this database has
 * no webhook store (flag_webhook, 0009_flag_notifications.sql) — the page
 * then says so instead of failing.
 */
export async function listFleetWebhooks(db: Queryable): Promise<Webhook[] | null> {
  const { rows } = await db.query<{ present: boolean }>(`SELECT to_regclass('flag_webhook') IS NOT NULL AS present`);
  return rows[0]?.present ? listWebhooks(db) : null;
}
