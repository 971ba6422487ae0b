import { spawnSync } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { verifyPassword } from '../lib/auth/password';
import { createUser } from '../lib/auth/users';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';

/**
 * `holdfast user create|list|disable` as a script runs it: the password piped
 * on standard input, never printed, stored only as a scrypt hash.
 */
describe('holdfast user', () => {
  let db: TestDatabase;
  const PASSWORD = 'anchors aweigh at dawn';
  const holdfast = (args: string[], input = '') =>
    spawnSync(process.execPath, ['bin/holdfast.mjs', 'user', ...args], {
      env: { ...process.env, DATABASE_URL: db.url, LOG_LEVEL: 'warn' },
      input,
      encoding: 'utf8',
    });

  beforeAll(async () => {
    db = await createMigratedDatabase();
  });
  afterAll(async () => db?.drop());

  it('creates the first admin from a piped password, printing no secret', { timeout: 60_000 }, async () => {
    const result = holdfast(['create', '--email', 'Admin@Example.com', '--name', 'First Admin', '--role', 'admin'], `${PASSWORD}\n`);
    expect(result.status, result.stderr).toBe(0);
    expect(result.stdout.trim()).toMatch(/^created user \d+ admin@example\.com \(admin\)\.$/);
    expect(result.stdout + result.stderr).not.toContain(PASSWORD);
    const { rows } = await db.pool.query(`SELECT role, password_hash, organisation_id FROM app_user WHERE email = 'admin@example.com'`);
    expect(rows[0]).toMatchObject({ role: 'admin', organisation_id: null });
    expect(rows[0].password_hash).toMatch(/^\$scrypt\$ln=17,r=8,p=1\$/);
    expect(await verifyPassword(PASSWORD, rows[0].password_hash)).toBe(true);
  });

  it('creates a charterer with its organisation, and says when that organisation has no campaign', { timeout: 60_000 }, () => {
    const result = holdfast(['create', '--email', 'rep@aldmoor.example', '--name', 'Aldmoor Rep', '--role', 'charterer', '--organisation', 'aldmoor'], `${PASSWORD}\n`);
    expect(result.status, result.stderr).toBe(0);
    expect(result.stdout).toContain('(charterer, organisation aldmoor, new).');
    expect(result.stdout).toContain('No campaign belongs to organisation aldmoor yet');
  });

  it.each([
    [['--email', 'x@example.com', '--name', 'X', '--role', 'admin'], 'short', 'at least 15 characters'],
    [['--email', 'ADMIN@example.com', '--name', 'X', '--role', 'admin'], PASSWORD, 'a user with the e-mail address admin@example.com exists'],
    [['--email', 'x@example.com', '--name', 'X', '--role', 'admin'], '', 'no password on standard input'],
  ])('refuses %j with one line and exit code 2', { timeout: 60_000 }, (args, password, message) => {
    const result = holdfast(['create', ...args], password ? `${password}\n` : '');
    expect(result.stderr.trim()).toContain(message);
    expect(result.status).toBe(2);
    expect(result.stderr.split('\n').filter(Boolean)).toHaveLength(1);
  });

  it.each([
    [{ role: 'charterer' }, 'a charterer needs an organisation'],
    [{ role: 'admin', organisationKey: 'aldmoor' }, 'only a charterer belongs to an organisation'],
    [{ role: 'root' }, 'the role must be one of'],
    [{ email: 'not-an-address' }, 'is not an e-mail address'],
    [{ displayName: '  ' }, 'the name must be 1 to 100 characters'],
    [{ password: 'x@example.com and more' }, 'too close to your name'],
    [{ role: 'charterer', organisationKey: 'Not A Key' }, 'organisation key'],
  ])('refuses %j before storing anything', async (change, message) => {
    const input = { email: 'x@example.com', displayName: 'X', role: 'admin', password: PASSWORD, ...change };
    await expect(createUser(db.pool, input, { actor: { kind: 'cli' }, scrypt: { ln: 10, r: 8, p: 1 } })).rejects.toThrow(message);
    const { rows } = await db.pool.query(`SELECT count(*)::int AS n FROM app_user WHERE email = 'x@example.com'`);
    expect(rows[0].n).toBe(0);
  });

  it('lists users and disables one', { timeout: 60_000 }, async () => {
    const list = holdfast(['list']);
    expect(list.status, list.stderr).toBe(0);
    expect(list.stdout).toMatch(/admin@example\.com\tadmin\tactive\tnever signed in/);
    expect(list.stdout).toMatch(/rep@aldmoor\.example\tcharterer:aldmoor\tactive/);
    const disabled = holdfast(['disable', '--email', 'rep@aldmoor.example']);
    expect(disabled.status, disabled.stderr).toBe(0);
    const { rows } = await db.pool.query(`SELECT disabled_at FROM app_user WHERE email = 'rep@aldmoor.example'`);
    expect(rows[0].disabled_at).toBeInstanceOf(Date);
    expect(holdfast(['disable', '--email', 'rep@aldmoor.example']).status).toBe(2);
  });
});
