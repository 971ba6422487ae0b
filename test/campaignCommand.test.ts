import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readFleetFile } from '../lib/register/fleetFile';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';

/**
 * `holdfast campaign assign|unassign`: the one way an operator gives a
 * register campaign to a charterer's organisation (the register names none).
 */
describe('holdfast campaign', () => {
  let db: TestDatabase;
  const vessel = `camp-${uniqueSuffix()}`;
  const holdfast = (args: string[]) =>
    spawnSync(process.execPath, ['bin/holdfast.mjs', 'campaign', ...args], {
      env: { ...process.env, DATABASE_URL: db.url, LOG_LEVEL: 'warn' },
      encoding: 'utf8',
    });
  const owner = async () =>
    (
      await db.pool.query(
        `SELECT o.key FROM campaign c LEFT JOIN organisation o ON o.id = c.organisation_id WHERE c.key = 'north-survey-2026'`,
      )
    ).rows[0]?.key ?? null;

  beforeAll(async () => {
    db = await createMigratedDatabase();
    const file = smallFleet(vessel);
    await registerFleet(
      db.url,
      readFleetFile(
        JSON.stringify({
          ...file,
          campaigns: [{ key: 'north-survey-2026', charterer: 'Brenmoor Offshore', vessels: [vessel], from: '2026-09-01', to: '2026-12-31', site: { name: 'Skerrow Bank', lat: 58.1, lon: 1.9 }, watch_circles_m: [3, 5] }],
        }),
      ),
    );
  });
  afterAll(async () => db?.drop());

  it('gives a campaign to an organisation (made when new), takes it away, and audits both', { timeout: 60_000 }, async () => {
    const assigned = holdfast(['assign', 'north-survey-2026', '--organisation', 'brenmoor']);
    expect(assigned.status, assigned.stderr).toBe(0);
    expect(assigned.stdout).toContain('campaign north-survey-2026 now belongs to organisation brenmoor (new)');
    expect(await owner()).toBe('brenmoor');

    const unassigned = holdfast(['unassign', 'north-survey-2026']);
    expect(unassigned.status, unassigned.stderr).toBe(0);
    expect(await owner()).toBeNull();

    const { rows } = await db.pool.query(`SELECT action, subject, actor FROM audit_log WHERE action LIKE 'campaign.%' ORDER BY id`);
    expect(rows.map((r) => [r.action, r.subject, r.actor])).toEqual([
      ['campaign.assign', 'north-survey-2026', 'cli'],
      ['campaign.unassign', 'north-survey-2026', 'cli'],
    ]);
  });

  it.each([
    [['assign', 'no-such-campaign', '--organisation', 'brenmoor'], 'no campaign "no-such-campaign" in the fleet register'],
    [['assign', 'north-survey-2026', '--organisation', 'Bad Key!'], 'organisation key "Bad Key!" must be'],
    [['assign', 'north-survey-2026'], 'usage: holdfast campaign assign'],
  ])('refuses %j with one line and exit code 2, changing nothing', { timeout: 60_000 }, async (args, message) => {
    const before = await owner();
    const result = holdfast(args);
    expect(result.stderr.trim()).toContain(message);
    expect(result.stderr.split('\n').filter(Boolean)).toHaveLength(1);
    expect(result.status).toBe(2);
    expect(await owner()).toBe(before);
  });
});
