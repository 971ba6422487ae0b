import type { Pool } from 'pg';

/** Webhook subscriptions (flag_webhook): add, list, remove. */

type Queryable = Pick<Pool, 'query'>;

export interface Webhook {
  id: number;
  url: string;
  hasSecret: boolean;
  enabled: boolean;
  pending: number;
  delivered: number;
  lastError: string | null;
}

/** Only http(s) URLs; a webhook needs a place to POST to. */
export function checkWebhookUrl(url: string): string {
  let u: URL;
  try {
    u = new URL(url);
  } catch {
    throw new Error(`not a URL: ${url}`);
  }
  if (u.protocol !== 'http:' && u.protocol !== 'https:') throw new Error(`webhook URL must be http:// or https://, got ${u.protocol}`);
  return u.toString();
}

/** Add (or re-enable, with the new secret) a webhook; its id. Flags opened from now on are sent to it. */
export async function addWebhook(db: Queryable, url: string, secret: string | null): Promise<number> {
  const { rows } = await db.query<{ id: number }>(
    `INSERT INTO flag_webhook (url, secret) VALUES ($1, $2)
     ON CONFLICT (url) DO UPDATE SET secret = EXCLUDED.secret, enabled = true
     RETURNING id`,
    [checkWebhookUrl(url), secret],
  );
  return rows[0]!.id;
}

/** Remove a webhook and its undelivered and delivered outbox rows. */
export async function removeWebhook(db: Queryable, id: number): Promise<boolean> {
  const { rowCount } = await db.query('DELETE FROM flag_webhook WHERE id = $1', [id]);
  return (rowCount ?? 0) > 0;
}

export async function listWebhooks(db: Queryable): Promise<Webhook[]> {
  const { rows } = await db.query(
    `SELECT w.id, w.url, w.secret IS NOT NULL AS "hasSecret", w.enabled,
            count(o.id) FILTER (WHERE o.delivered_at IS NULL)::int AS pending,
            count(o.id) FILTER (WHERE o.delivered_at IS NOT NULL)::int AS delivered,
            (SELECT last_error FROM flag_outbox x WHERE x.webhook_id = w.id AND x.delivered_at IS NULL AND x.last_error IS NOT NULL
              ORDER BY x.id DESC LIMIT 1) AS "lastError"
       FROM flag_webhook w LEFT JOIN flag_outbox o ON o.webhook_id = w.id
      GROUP BY w.id ORDER BY w.id`,
  );
  return rows as Webhook[];
}
