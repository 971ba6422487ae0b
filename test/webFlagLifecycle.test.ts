import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createPrisma, type PrismaClient } from '../lib/db/prisma';
import { acknowledgeFlag, closeFlag } from '../lib/queries/flagLifecycle';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';

/**
 * The people's side of a flag's lifecycle against a real PostgreSQL:
 * open → acknowledged → closed, never backwards, never twice, two people
 * acting at once cannot both succeed, and a refused step says why.
 */
describe('flag lifecycle', () => {
  let db: TestDatabase;
  let prisma: PrismaClient;
  let vesselId = 0;

  const newFlag = async (metric: string) =>
    BigInt(
      (
        await db.pool.query<{ id: string }>(
          `INSERT INTO flag (vessel_id, subject, metric, method, severity, opened_day, window_from, window_to, statistic, statistic_name,
                             explanation, last_evaluated_day)
           VALUES ($1, 'vessel', $2, 'ewma', 'warning', '2026-11-30', '2026-11-01', '2026-11-30', 1.4, 'ewma', 'x', '2026-11-30') RETURNING id`,
          [vesselId, metric],
        )
      ).rows[0]!.id,
    );
  const row = async (id: bigint) => (await db.pool.query('SELECT * FROM flag WHERE id = $1', [id])).rows[0];

  beforeAll(async () => {
    db = await createMigratedDatabase();
    prisma = createPrisma(db.url);
    vesselId = (
      await db.pool.query<{ id: number }>(
        `INSERT INTO vessel (key, name, type, dp_class, watch_circles_m, heading_limits_deg) VALUES ('lc-one', 'LC One', 'supply', 2, '{3,5}', '{3,5}') RETURNING id`,
      )
    ).rows[0]!.id;
  });
  afterAll(async () => {
    await prisma?.$disconnect();
    await db?.drop();
  });

  it('acknowledges an open flag once, with who, when and the note', async () => {
    const id = await newFlag('p95_norm');
    const at = new Date('2026-12-01T09:30:00Z');
    expect(await acknowledgeFlag(prisma, { id, by: 'Ana Reyes', note: 'Looking at GNSS1.', at })).toBe('done');
    expect(await row(id)).toMatchObject({ status: 'acknowledged', acknowledged_by: 'Ana Reyes', acknowledge_note: 'Looking at GNSS1.', acknowledged_at: at });
    expect(await acknowledgeFlag(prisma, { id, by: 'Someone Else', note: 'again' })).toBe('wrong_status');
    expect((await row(id)).acknowledged_by).toBe('Ana Reyes');
  });

  it('closes an acknowledged or open flag, and never reopens or re-closes it', async () => {
    const acked = await newFlag('hdg_rms');
    await acknowledgeFlag(prisma, { id: acked, by: 'Ana Reyes', note: 'n' });
    expect(await closeFlag(prisma, { id: acked, by: 'shore engineer', reason: 'resolved', note: 'Gains restored.' })).toBe('done');
    expect(await row(acked)).toMatchObject({ status: 'closed', close_reason: 'resolved', closed_by: 'shore engineer', close_note: 'Gains restored.' });
    expect(await closeFlag(prisma, { id: acked, by: 'x', reason: 'dismissed', note: 'again' })).toBe('wrong_status');
    expect(await acknowledgeFlag(prisma, { id: acked, by: 'x', note: 'back' })).toBe('wrong_status');
    expect((await row(acked)).close_reason).toBe('resolved');

    const open = await newFlag('rejections');
    expect(await closeFlag(prisma, { id: open, by: 'Ana Reyes', reason: 'dismissed', note: 'Known weather.' })).toBe('done');
    expect(await row(open)).toMatchObject({ status: 'closed', close_reason: 'dismissed', acknowledged_at: null });
  });

  it('lets only one of two simultaneous acknowledgements through', async () => {
    const id = await newFlag('sd_m_median');
    const results = await Promise.all([
      acknowledgeFlag(prisma, { id, by: 'First', note: 'a' }),
      acknowledgeFlag(prisma, { id, by: 'Second', note: 'b' }),
    ]);
    expect(results.sort()).toEqual(['done', 'wrong_status']);
  });

  it('says when the flag does not exist', async () => {
    expect(await acknowledgeFlag(prisma, { id: 987654321n, by: 'x', note: 'y' })).toBe('not_found');
    expect(await closeFlag(prisma, { id: 987654321n, by: 'x', reason: 'resolved', note: 'y' })).toBe('not_found');
  });
});
