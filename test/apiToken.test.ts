import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { GET } from '../app/api/v1/vessels/route';
import { createApiToken, generateToken, hashToken, TOKEN_PATTERN, TokenInputError } from '../lib/api/tokens';
import { call, startApiTest, stopApiTest, type ApiTest } from './apiHelpers';

/** `holdfast token create|list|revoke` and what the store keeps of a token. */
describe('holdfast token', () => {
  let t: ApiTest;
  const holdfast = (...args: string[]) =>
    spawnSync(process.execPath, ['bin/holdfast.mjs', 'token', ...args], {
      env: { ...process.env, DATABASE_URL: t.db.url, LOG_LEVEL: 'warn' },
      encoding: 'utf8',
    });

  beforeAll(async () => {
    t = await startApiTest();
  });
  afterAll(() => stopApiTest(t));

  it('makes 32 random bytes as hf_ + base64url and hashes them with SHA-256', () => {
    const a = generateToken();
    const b = generateToken();
    expect(a).toMatch(TOKEN_PATTERN);
    expect(a).not.toBe(b);
    expect(Buffer.from(a.slice(3), 'base64url')).toHaveLength(32);
    // Source: FIPS 180-4 test vector, SHA-256("abc").
    expect(hashToken('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });

  it('create prints the token alone on its last line; the store keeps only its hash', { timeout: 60_000 }, async () => {
    const result = holdfast('create', '--name', 'nightly export', '--role', 'fleet_manager');
    expect(result.status, result.stderr).toBe(0);
    const lines = result.stdout.trimEnd().split('\n');
    const token = lines.at(-1)!;
    expect(token).toMatch(TOKEN_PATTERN);
    expect(lines[0]).toMatch(/^created token \d+ "nightly export" \(fleet_manager\)\.$/);

    const { rows } = await t.db.pool.query(`SELECT * FROM api_token WHERE name = 'nightly export'`);
    expect(rows).toHaveLength(1);
    expect(rows[0].token_hash).toBe(createHash('sha256').update(token).digest('hex'));
    expect(rows[0]).toMatchObject({ role: 'fleet_manager', campaign_id: null, last_used_at: null, revoked_at: null });
    expect(JSON.stringify(rows[0])).not.toContain(token.slice(3));

    expect((await call(GET, '/vessels', {}, token)).status).toBe(200);
  });

  it('scopes a charterer token to a campaign, and only a charterer token', { timeout: 90_000 }, async () => {
    const ok = holdfast('create', '--name', 'charterer rep', '--role', 'charterer', '--campaign', 'north-spool');
    expect(ok.status, ok.stderr).toBe(0);
    const { rows } = await t.db.pool.query(
      `SELECT c.key FROM api_token a JOIN campaign c ON c.id = a.campaign_id WHERE a.name = 'charterer rep'`,
    );
    expect(rows).toEqual([{ key: 'north-spool' }]);

    // The rules, in process (each CLI run costs seconds)…
    const refusals: [Parameters<typeof createApiToken>[1], string][] = [
      [{ name: 'x', role: 'admin', campaignKey: 'north-spool' }, '--campaign is only for a charterer token'],
      [{ name: 'x', role: 'charterer', campaignKey: 'nope' }, 'unknown campaign "nope"'],
      [{ name: 'x', role: 'captain' }, '--role must be one of admin, fleet_manager, shore_engineer, charterer (got "captain")'],
      [{ name: ' ', role: 'admin' }, '--name must be 1 to 100 characters'],
    ];
    for (const [input, message] of refusals) {
      await expect(createApiToken(t.db.pool, input)).rejects.toThrow(new TokenInputError(message));
    }
    // …and how the command reports one: the message alone, exit code 2.
    const refused = holdfast('create', '--name', 'x', '--role', 'charterer');
    expect(refused.status).toBe(2);
    expect(refused.stderr.trim()).toBe('a charterer token needs --campaign KEY');
    expect(holdfast('create', '--role', 'admin').status).toBe(2);
    // The table refuses a scope on a non-charterer token even when written by hand.
    await expect(
      t.db.pool.query(`INSERT INTO api_token (name, role, campaign_id, token_hash) SELECT 'x', 'admin', id, repeat('a', 64) FROM campaign`),
    ).rejects.toThrow(/check constraint/);
  });

  it('revoke refuses the token from then on; list shows it revoked', { timeout: 90_000 }, async () => {
    const created = holdfast('create', '--name', 'to revoke', '--role', 'shore_engineer');
    const token = created.stdout.trimEnd().split('\n').at(-1)!;
    const id = /^created token (\d+)/.exec(created.stdout)![1]!;
    expect((await call(GET, '/vessels', {}, token)).status).toBe(200);

    const revoked = holdfast('revoke', id);
    expect(revoked.status, revoked.stderr).toBe(0);
    expect(revoked.stdout.trim()).toBe(`revoked token ${id}`);
    expect((await call(GET, '/vessels', {}, token)).status).toBe(401);

    const listed = holdfast('list').stdout.split('\n').find((l) => l.startsWith(`${id}\t`));
    expect(listed).toMatch(new RegExp(`^${id}\\tto revoke\\tshore_engineer\\trevoked \\S+Z\\tlast used \\S+Z$`));
    expect(holdfast('revoke', '999999').stderr.trim()).toBe('no token has the id 999999');
    expect(holdfast('revoke').status).toBe(2);
  });
});
