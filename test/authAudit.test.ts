import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { readAudit, redact, writeAudit } from '../lib/auth/audit';
import { createUser, UserInputError } from '../lib/auth/users';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';

/** The audit log: written for each change, never holding secrets, never rewritten. */
describe('audit log', () => {
  let db: TestDatabase;
  const PASSWORD = 'the tide turns at nine';

  beforeAll(async () => {
    db = await createMigratedDatabase();
  });
  afterAll(async () => db?.drop());

  it('records who, what, on what, from where and when', async () => {
    const before = new Date();
    await writeAudit(db.pool, {
      actor: { kind: 'user', userId: 42, email: 'ingrid@example.com', role: 'shore_engineer', organisationId: null },
      action: 'flag.acknowledge',
      subject: 'flag 7',
      ip: '198.51.100.9',
      detail: { note: 'thruster T2 inspected' },
    });
    const [row] = await readAudit(db.pool, { action: 'flag.acknowledge' });
    expect(row).toMatchObject({ actor: 'ingrid@example.com', actorUserId: 42, actorTokenId: null, subject: 'flag 7', ip: '198.51.100.9', detail: { note: 'thruster T2 inspected' } });
    expect(row!.at.getTime()).toBeGreaterThanOrEqual(before.getTime() - 1000);
  });

  it('blanks anything that looks like a secret, at any depth', async () => {
    expect(redact({ password: 'x', nested: [{ passwordHash: 'y', csrfToken: 'z', tokenId: 3 }], sessionsRevoked: 2 })).toEqual({
      password: '[redacted]',
      nested: [{ passwordHash: '[redacted]', csrfToken: '[redacted]', tokenId: 3 }],
      sessionsRevoked: 2,
    });
    await writeAudit(db.pool, { actor: { kind: 'cli' }, action: 'test.secret', detail: { secret: 'hunter2', token: 'hf_abc' } });
    const [row] = await readAudit(db.pool, { action: 'test.secret' });
    expect(JSON.stringify(row)).not.toMatch(/hunter2|hf_abc/);
  });

  it('refuses to change a written entry', async () => {
    await expect(db.pool.query(`UPDATE audit_log SET actor = 'someone else'`)).rejects.toThrow(/audit_log rows cannot be changed/);
  });

  it('refuses action names outside area.verb', async () => {
    await expect(writeAudit(db.pool, { actor: { kind: 'system' }, action: 'DROP TABLE' })).rejects.toThrow(/audit_log_action_check/);
  });

  it('records a user created on the command line, without the password anywhere in the store', async () => {
    const { id } = await createUser(
      db.pool,
      { email: 'Harald@Example.com', displayName: 'Harald', role: 'charterer', organisationKey: 'aldmoor', password: PASSWORD },
      { actor: { kind: 'cli' }, scrypt: { ln: 10, r: 8, p: 1 } },
    );
    const [row] = await readAudit(db.pool, { action: 'user.create' });
    expect(row).toMatchObject({ actor: 'cli', subject: 'harald@example.com', detail: { userId: id, role: 'charterer', organisation: 'aldmoor', organisationCreated: true } });
    const dump = await db.pool.query(`SELECT (SELECT json_agg(a) FROM audit_log a)::text || (SELECT json_agg(u) FROM app_user u)::text AS text`);
    expect(dump.rows[0].text).not.toContain(PASSWORD);
    await expect(
      createUser(db.pool, { email: 'HARALD@example.com', displayName: 'Twin', role: 'admin', password: PASSWORD }, { actor: { kind: 'cli' }, scrypt: { ln: 10, r: 8, p: 1 } }),
    ).rejects.toThrow(UserInputError);
  });
});
