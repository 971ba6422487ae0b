import { createHmac } from 'node:crypto';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { retryDelaySeconds } from '../lib/flags/notify/backoff';
import { deliverDue } from '../lib/flags/notify/deliver';
import { addWebhook, listWebhooks } from '../lib/flags/notify/webhooks';
import { openFlag } from '../lib/flags/store/flagStore';
import { anyFreePort } from '../lib/net/freePort';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { insertVessel } from './flagsFixtures';

/**
 * The webhook outbox against real local HTTP servers: a receiver that is
 * down, then failing, then back gets every flag exactly once; a receiver
 * that is up meanwhile is not held back by it.
 */

interface Received {
  delivery: string;
  signature: string | undefined;
  body: string;
}

/** A receiver on `port` that answers the first `failures` requests with 503, then 204. */
function receiver(port: number, failures: number): Promise<{ server: http.Server; ok: Received[]; refused: number }> {
  const state = { ok: [] as Received[], refused: 0 };
  const server = http.createServer((req, res) => {
    let body = '';
    req.on('data', (c: Buffer) => (body += c.toString('utf8')));
    req.on('end', () => {
      if (state.refused < failures) {
        state.refused++;
        res.writeHead(503).end();
        return;
      }
      state.ok.push({ delivery: String(req.headers['x-holdfast-delivery']), signature: req.headers['x-holdfast-signature'] as string | undefined, body });
      res.writeHead(204).end();
    });
  });
  return new Promise((resolve) =>
    server.listen(port, '127.0.0.1', () =>
      resolve({
        server,
        get ok() {
          return state.ok;
        },
        get refused() {
          return state.refused;
        },
      }),
    ),
  );
}

const close = (s: http.Server) => new Promise<void>((r) => s.close(() => r()));
const at = (t0: Date, seconds: number) => new Date(t0.getTime() + seconds * 1000);

describe('flag webhooks through the outbox', () => {
  let db: TestDatabase;
  let flapping: Awaited<ReturnType<typeof receiver>> | undefined;
  let steady: Awaited<ReturnType<typeof receiver>>;
  let flappingPort: number;
  const flagIds: number[] = [];

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const vesselId = await insertVessel(db.pool, 'webhook-skua');
    flappingPort = await anyFreePort();
    steady = await receiver(0, 0);
    await addWebhook(db.pool, `http://127.0.0.1:${flappingPort}/flags`, 's3cret');
    await addWebhook(db.pool, `http://127.0.0.1:${(steady.server.address() as AddressInfo).port}/hook`, null);
    for (const subject of ['thruster:T1', 'thruster:T2', 'ref:GNSS1']) {
      const client = await db.pool.connect();
      try {
        await client.query('BEGIN');
        const id = await openFlag(client, {
          vesselId,
          subject,
          metric: subject.startsWith('ref') ? 'sd_m_median' : 'efficiency_index',
          method: 'mann_kendall',
          severity: 'warning',
          openedDay: '2026-07-20',
          windowFrom: '2026-06-21',
          windowTo: '2026-07-20',
          statistic: -3.5,
          statisticName: 'kendall_z',
          explanation: `${subject} drifting`,
          evidence: {},
        });
        await client.query('COMMIT');
        flagIds.push(id!);
      } finally {
        client.release();
      }
    }
  });
  afterAll(async () => {
    if (flapping) await close(flapping.server);
    await close(steady.server);
    await db?.drop();
  });

  it('doubles the wait after each failure up to an hour (backoff.ts)', () => {
    expect([1, 2, 3, 4, 7, 8, 20].map(retryDelaySeconds)).toEqual([30, 60, 120, 240, 1920, 3600, 3600]);
  });

  it('delivers to the receiver that is up while the other is down, and keeps the rest', async () => {
    const t0 = new Date();
    const first = await deliverDue(db.pool, t0);
    // The steady receiver got all three; the down one was tried once, its other two rows wait with it.
    expect(first).toEqual({ attempted: 4, delivered: 3, failed: 1 });
    expect(steady.ok.map((r) => JSON.parse(r.body).flag.id).sort()).toEqual([...flagIds].sort());
    const { rows } = await db.pool.query(
      `SELECT attempts, last_error, next_attempt_at FROM flag_outbox o JOIN flag_webhook w ON w.id = o.webhook_id
        WHERE w.secret IS NOT NULL ORDER BY o.id`,
    );
    expect(rows.map((r) => r.attempts)).toEqual([1, 0, 0]);
    expect(rows[0].last_error).toBe('ECONNREFUSED');
    for (const r of rows) expect(r.next_attempt_at.getTime()).toBe(at(t0, 30).getTime());
    // Nothing is due before the backoff ends.
    expect(await deliverDue(db.pool, at(t0, 29))).toEqual({ attempted: 0, delivered: 0, failed: 0 });

    // Back, but failing once more (503), then healthy.
    flapping = await receiver(flappingPort, 1);
    expect(await deliverDue(db.pool, at(t0, 30))).toEqual({ attempted: 1, delivered: 0, failed: 1 });
    expect(await deliverDue(db.pool, at(t0, 30 + 59))).toEqual({ attempted: 0, delivered: 0, failed: 0 });
    expect(await deliverDue(db.pool, at(t0, 30 + 60))).toEqual({ attempted: 3, delivered: 3, failed: 0 });
    expect(await deliverDue(db.pool, at(t0, 10_000))).toEqual({ attempted: 0, delivered: 0, failed: 0 });

    // Every flag exactly once, in the order they were opened, signed, with its delivery id.
    expect(flapping.refused).toBe(1);
    expect(flapping.ok.map((r) => JSON.parse(r.body).flag.id)).toEqual(flagIds);
    for (const r of flapping.ok) {
      // Source: the scheme GitHub documents for webhook signatures ("Validating webhook deliveries"):
      // sha256= and the hex HMAC-SHA256 of the raw body under the shared secret.
      expect(r.signature).toBe(`sha256=${createHmac('sha256', 's3cret').update(r.body).digest('hex')}`);
      const payload = JSON.parse(r.body);
      expect(payload).toMatchObject({ event: 'flag.opened', flag: { vessel: 'webhook-skua', vessel_name: 'WEBHOOK-SKUA', status: 'open', window_from: '2026-06-21' } });
    }
    expect(steady.ok.every((r) => r.signature === undefined)).toBe(true);
    const hooks = await listWebhooks(db.pool);
    expect(hooks.map((h) => [h.delivered, h.pending])).toEqual([
      [3, 0],
      [3, 0],
    ]);
  });
});
