import { spawnSync } from 'node:child_process';
import { writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { evaluateAfterRecompute, lastCompleteDay, vesselsTouchingWindow } from '../lib/jobs/flagJob';
import { addDays } from '../lib/time/fleetDay';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { insertThrusterDays, insertVessel, insertVesselDays } from './flagsFixtures';

/** Each command is a child process that loads TypeScript: seconds each, more on a busy machine. */
const SLOW = 180_000;

/** `holdfast flags …` end to end (a child process on a real database), and when the job re-evaluates. */
describe('holdfast flags', () => {
  let db: TestDatabase;
  let vesselId: number;
  const FROM = '2026-03-01';
  const day = (n: number) => addDays(FROM, n);

  const run = (...args: string[]) =>
    spawnSync(process.execPath, ['bin/holdfast.mjs', 'flags', ...args], {
      env: { ...process.env, DATABASE_URL: db.url, LOG_LEVEL: 'warn', FLEET_TIME_ZONE: 'UTC' },
      encoding: 'utf8',
    });

  beforeAll(async () => {
    db = await createMigratedDatabase();
    vesselId = await insertVessel(db.pool, 'cli-petrel');
    await insertVesselDays(db.pool, vesselId, Array.from({ length: 70 }, (_, i) => ({ day: day(i), wind_mean_ms: 9 + 5 * Math.sin(i * 2.3) })));
    // Efficiency flat, then falling 1.5 % a day from day 50.
    await insertThrusterDays(db.pool, vesselId, 'AZ2', Array.from({ length: 70 }, (_, i) => ({ day: day(i), efficiency_index: 1.7 * (1 + 0.01 * Math.sin(i * 2.4)) * (1 - 0.015 * Math.max(0, i - 50)) })));
  });
  afterAll(() => db?.drop());

  it('evaluates a range of days oldest first, once, however often it is run', () => {
    const first = run('evaluate', '--from', day(30), '--to', day(69));
    expect(first.status, first.stderr).toBe(0);
    expect(first.stdout.trim().split('\n')).toHaveLength(40);
    expect(first.stdout).toMatch(/flags 2026-\d\d-\d\d: \d+ series judged on 1 vessel\(s\), 1 opened/);
    expect(run('evaluate', '--day', day(69)).status).toBe(0);
    expect(run('evaluate', '--from', day(30), '--to', day(69)).stdout).not.toMatch(/[1-9]\d* opened/);
  }, SLOW);

  it('acknowledges and closes through the web app’s lifecycle functions, and refuses the wrong order', async () => {
    const { rows } = await db.pool.query(`SELECT id FROM flag WHERE vessel_id = $1`, [vesselId]);
    expect(rows).toHaveLength(1);
    const id = String(rows[0].id);
    expect(run('ack', id, '--by', 'A. Engineer', '--note', 'survey booked').stdout.trim()).toBe(`acknowledged flag ${id}`);
    const again = run('ack', id, '--by', 'A. Engineer');
    expect(again.status).toBe(2);
    expect(again.stderr.trim()).toBe(`flag ${id}: not open`);
    expect(run('close', id, '--by', 'A. Engineer', '--reason', 'resolved').stdout.trim()).toBe(`closed flag ${id} (resolved)`);
    expect(run('close', '999999', '--by', 'x', '--reason', 'dismissed').stderr.trim()).toBe('flag 999999: no flag has this id');
    expect(run('close', id, '--by', 'x', '--reason', 'fixed').status).toBe(2);
    const { rows: after } = await db.pool.query(`SELECT status, acknowledge_note, close_reason FROM flag WHERE id = $1`, [id]);
    expect(after[0]).toEqual({ status: 'closed', acknowledge_note: 'survey booked', close_reason: 'resolved' });
  }, SLOW);

  it('stores settings from a file over the defaults and refuses a bad file with every fault', () => {
    const dir = os.tmpdir();
    const good = path.join(dir, `flags-good-${process.pid}.json`);
    const bad = path.join(dir, `flags-bad-${process.pid}.json`);
    writeFileSync(good, JSON.stringify({ closeAfterClearDays: 3, series: { rejections: { enabled: false } } }));
    writeFileSync(bad, JSON.stringify({ windowDays: 0, ewma: { lambda: 2 } }));
    const stored = run('settings', good);
    expect(stored.status, stored.stderr).toBe(0);
    const effective = JSON.parse(stored.stdout);
    expect(effective.closeAfterClearDays).toBe(3);
    expect(effective.series.rejections).toMatchObject({ enabled: false, minAbsoluteChange: 20 });
    expect(effective.ewma).toEqual({ lambda: 0.2, k: 3 });
    const refused = run('settings', bad);
    expect(refused.status).toBe(2);
    expect(refused.stderr).toMatch(/windowDays: .*; ewma\.lambda: /);
  }, SLOW);

  it('adds, lists and removes webhooks', () => {
    expect(run('webhook', 'add', 'http://127.0.0.1:9/in', '--secret', 'k').stdout).toMatch(/^webhook 1: http:\/\/127\.0\.0\.1:9\/in receives/);
    expect(run('webhook', 'add', 'ftp://x').status).toBe(2);
    expect(run('webhook', 'list').stdout.trim()).toBe('1\thttp://127.0.0.1:9/in\tenabled, signed\t0 delivered, 0 pending');
    expect(run('webhook', 'remove', '1').stdout.trim()).toBe('removed webhook 1');
    expect(run('nonsense').status).toBe(2);
  }, SLOW);

  it('re-evaluates after a recompute only the vessels whose changed days are in yesterday’s window', async () => {
    const now = new Date(`${day(70)}T06:00:00Z`);
    expect(lastCompleteDay('UTC', now)).toBe(day(69));
    expect(vesselsTouchingWindow([{ vesselId: 5, day: day(39) }, { vesselId: 3, day: day(40) }, { vesselId: 3, day: day(69) }, { vesselId: 4, day: day(70) }], day(69), 30)).toEqual([3]);
    expect(await evaluateAfterRecompute(db.pool, [{ vesselId, day: day(20) }], 'UTC', now)).toBeNull();
    const summary = await evaluateAfterRecompute(db.pool, [{ vesselId, day: day(68) }], 'UTC', now);
    expect(summary).toMatchObject({ day: day(69), vessels: 1 });
  });
});
