import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { listFlags } from '../lib/api/queries/listFlags';
import { DEFAULT_FLAG_SETTINGS, parseFlagSettings } from '../lib/flags/config';
import { evaluateDay } from '../lib/flags/evaluate';
import { addWebhook } from '../lib/flags/notify/webhooks';
import { createPrisma, type PrismaClient } from '../lib/db/prisma';
import { acknowledgeFlag, closeFlag } from '../lib/queries/flagLifecycle';
import { writeFlagSettings } from '../lib/flags/store/settings';
import { addDays } from '../lib/time/fleetDay';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { insertThrusterDays, insertVessel, insertVesselDays } from './flagsFixtures';

/**
 * The flag store's lifecycle on a real database: one flag per series however
 * often the job runs, clearing proposes closing, people acknowledge and close,
 * a closed flag is not raised again from the same evidence, and every new
 * flag is queued for each webhook in the same transaction.
 */

const TZ = 'UTC';
const FROM = '2026-03-01';
const day = (n: number) => addDays(FROM, n);

/**
 * A thruster's efficiency: flat (with a weekly wobble) for 50 days, then falling 1.5 % a day for
 * 20, flat at the new level from day 70, and falling again from day 140 (a second fault).
 */
function efficiency(n: number): number {
  const wobble = 0.01 * Math.sin((2 * Math.PI * n) / 7);
  const fall = Math.min(Math.max(0, n - 50), 20) * 0.015 + Math.max(0, n - 140) * 0.015;
  return 1.7 * (1 + wobble) * (1 - fall);
}

/** Each day's mean wind (efficiency is weather-adjusted, so the job needs it): 4–14 m/s, not related to the efficiency here. */
const weatherDays = (n: number) => Array.from({ length: n }, (_, i) => ({ day: day(i), wind_mean_ms: 9 + 5 * Math.sin(i * 2.3) }));

describe('flag lifecycle', () => {
  let db: TestDatabase;
  let vesselId: number;
  let prisma: PrismaClient;
  const flags = async () => (await db.pool.query(`SELECT * FROM flag WHERE vessel_id = $1 ORDER BY id`, [vesselId])).rows;
  const run = async (from: number, to: number) => {
    for (let n = from; n <= to; n++) await evaluateDay(db.pool, day(n), { timeZone: TZ });
  };

  beforeAll(async () => {
    db = await createMigratedDatabase();
    prisma = createPrisma(db.url);
    vesselId = await insertVessel(db.pool, 'lifecycle-kite');
    await insertVesselDays(db.pool, vesselId, weatherDays(170));
    await insertThrusterDays(db.pool, vesselId, 'T3', Array.from({ length: 170 }, (_, n) => ({ day: day(n), efficiency_index: efficiency(n) })));
    await addWebhook(db.pool, 'http://127.0.0.1:9/hook-a', null);
    await addWebhook(db.pool, 'http://127.0.0.1:9/hook-b', 'k');
    await db.pool.query(`INSERT INTO flag_webhook (url, enabled) VALUES ('http://127.0.0.1:9/disabled', false)`);
    // Close proposals after 5 clear days, to keep the test short.
    await writeFlagSettings(db.pool, { closeAfterClearDays: 5 });
  });
  afterAll(async () => {
    await prisma?.$disconnect();
    await db?.drop();
  });

  it('opens one flag when the fall shows, with its method, window, statistic, severity, explanation and evidence', async () => {
    await run(9, 49);
    expect(await flags()).toEqual([]);
    await run(50, 60);
    const [flag, ...more] = await flags();
    expect(more).toEqual([]);
    expect(flag).toMatchObject({ subject: 'thruster:T3', metric: 'efficiency_index', status: 'open', clear_days: 0 });
    // A fall of 1.5 %/day opens by the fast path (CUSUM confirmed by the rank-sum test) before both slow methods agree.
    expect(flag.method).toBe('cusum+rank_sum');
    expect(flag.statistic_name).toBe('cusum_sd');
    expect(flag.statistic).toBeGreaterThan(flag.evidence.cusum.h / flag.evidence.cusum.sigma);
    expect(['advisory', 'warning', 'alarm']).toContain(flag.severity);
    expect(flag.opened_day > day(50) && flag.opened_day <= day(58)).toBe(true);
    expect(flag.window_to).toBe(flag.opened_day);
    expect(flag.window_from).toBe(addDays(flag.opened_day, -29));
    expect(flag.explanation).toMatch(/^Thruster T3 efficiency down to [\d.]+ kN\/kW\^\(2\/3\) against a baseline of .*CUSUM at [\d.]+ σ, past its decision interval of 8 σ.*its last \d+ days rank below the baseline's and the window's \d+ days before them \(Wilcoxon–Mann–Whitney, p /);
    expect(flag.evidence.opened_by).toBe('cusum+rank_sum');
    expect(flag.evidence.cusum).toMatchObject({ holds: true, signal: true, confirm_alpha: 0.001 });
    expect(flag.evidence.cusum).toMatchObject({ confirm_test: 'rank_sum', confirm_days: expect.any(Number) });
    expect(flag.evidence.cusum.confirm_p).toBeLessThan(0.001);
    expect(flag.evidence.mann_kendall.s).toEqual(expect.any(Number));
    expect(flag.evidence.ewma.lambda).toBe(0.2);
    expect(flag.last_evaluated_day).toBe(day(60));
  });

  it('queues the new flag for each enabled webhook, once', async () => {
    const { rows } = await db.pool.query(
      `SELECT w.url, o.payload FROM flag_outbox o JOIN flag_webhook w ON w.id = o.webhook_id ORDER BY w.id`,
    );
    expect(rows.map((r) => r.url)).toEqual(['http://127.0.0.1:9/hook-a', 'http://127.0.0.1:9/hook-b']);
    expect(rows[0].payload).toMatchObject({ event: 'flag.opened', flag: { vessel: 'lifecycle-kite', subject: 'thruster:T3', metric: 'efficiency_index', status: 'open' } });
  });

  it('never duplicates the flag or moves its counts when the same days run again', async () => {
    const before = await flags();
    await run(40, 60);
    await run(60, 60);
    const after = await flags();
    expect(after).toHaveLength(1);
    expect(after[0].updated_at).toEqual(before[0].updated_at);
    expect((await db.pool.query('SELECT count(*)::int AS n FROM flag_outbox')).rows[0].n).toBe(2);
  });

  it('counts clear days once the fall stops and proposes closing after the configured number', async () => {
    // Days 71 on: flat at the new level; the 30-day window still sees the fall for a while.
    await run(61, 119);
    const [flag] = await flags();
    expect(flag.status).toBe('open');
    expect(flag.clear_days).toBeGreaterThanOrEqual(5);
    expect(flag.close_proposed_day).not.toBeNull();
    expect(flag.close_proposed_day <= day(119)).toBe(true);
    expect(await flags()).toHaveLength(1);
  });

  it('moves open → acknowledged → closed with who, when and a note, and refuses the wrong order', async () => {
    const [{ id }] = await flags();
    const at = new Date(`${day(75)}T12:00:00Z`);
    // The people's side is the web app's (lib/queries/flagLifecycle.ts); the job must agree with it.
    expect(await closeFlag(prisma, { id: BigInt(id), by: 'ops', reason: 'resolved', note: '', at })).toBe('done');
    expect(await closeFlag(prisma, { id: BigInt(id), by: 'ops', reason: 'resolved', note: '', at })).toBe('wrong_status');
    expect(await acknowledgeFlag(prisma, { id: BigInt(id), by: 'ops', note: '' })).toBe('wrong_status');
    const [closed] = await flags();
    expect(closed).toMatchObject({ status: 'closed', closed_by: 'ops', close_reason: 'resolved' });
    expect(closed.closed_at.toISOString()).toBe(at.toISOString());
  });

  it('judges the series only after the close: no flag from the old evidence, a new one for a new fall', async () => {
    // Days after the close hold the lower, flat level: closing accepted it as the new normal.
    await run(76, 139);
    expect((await flags()).filter((f) => f.status !== 'closed')).toEqual([]);
    await run(140, 169);
    const live = (await flags()).filter((f) => f.status !== 'closed');
    expect(live).toHaveLength(1);
    expect(live[0].opened_day > day(140)).toBe(true);
    expect(live[0].window_from > day(75)).toBe(true);
  });

  it('keeps the API query of the flag table working beside the new columns', async () => {
    const listed = await listFlags(db.pool, { status: 'all', vesselKey: 'lifecycle-kite' });
    expect(listed!.map((f) => f.status)).toEqual(['open', 'closed']);
    expect(listed![1]).toMatchObject({ vessel: 'lifecycle-kite', subject: 'thruster:T3', metric: 'efficiency_index' });
  });

  it('acknowledges an open flag with who, when and a note', async () => {
    const other = await insertVessel(db.pool, 'lifecycle-tern');
    await insertVesselDays(db.pool, other, weatherDays(70));
    await insertThrusterDays(db.pool, other, 'T1', Array.from({ length: 70 }, (_, n) => ({ day: day(n), efficiency_index: efficiency(n) })));
    for (let n = 40; n <= 69; n++) await evaluateDay(db.pool, day(n), { timeZone: TZ, vesselIds: [other] });
    const { rows } = await db.pool.query(`SELECT id FROM flag WHERE vessel_id = $1`, [other]);
    expect(rows).toHaveLength(1);
    expect(await acknowledgeFlag(prisma, { id: BigInt(rows[0].id), by: 'shore engineer', note: 'checking the hull survey' })).toBe('done');
    const { rows: after } = await db.pool.query(`SELECT status, acknowledged_by, acknowledge_note, acknowledged_at FROM flag WHERE id = $1`, [rows[0].id]);
    expect(after[0]).toMatchObject({ status: 'acknowledged', acknowledged_by: 'shore engineer', acknowledge_note: 'checking the hull survey' });
    expect(after[0].acknowledged_at).toBeInstanceOf(Date);
  });

  it('reads stored settings over the defaults and refuses bad ones', () => {
    expect(parseFlagSettings({ closeAfterClearDays: 5 }).windowDays).toBe(DEFAULT_FLAG_SETTINGS.windowDays);
    expect(() => parseFlagSettings({ windowDays: 5, minDays: 10 })).toThrow(/minDays/);
    expect(() => parseFlagSettings({ series: { p95_norm: { minRelativeChange: -1 } } })).toThrow(/series\.p95_norm\.minRelativeChange/);
    expect(() => parseFlagSettings({ windowdays: 30 })).toThrow();
  });
});
