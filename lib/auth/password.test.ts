import { scrypt } from 'node:crypto';
import { describe, expect, it } from 'vitest';
import { DEFAULT_SCRYPT, dummyPasswordHash, hashPassword, needsRehash, parsePasswordHash, verifyPassword, withHashSlot, type ScryptParams } from './password';

// Cheap parameters for the tests that only exercise the format; the defaults are checked once below.
const FAST: ScryptParams = { ln: 10, r: 8, p: 1 };

describe('scrypt, the primitive under the password hash', () => {
  it('matches the RFC 7914 test vector (section 12, "password"/"NaCl", N=1024, r=8, p=16)', async () => {
    // Source: RFC 7914 section 12, third vector.
    const expected =
      'fdbabe1c9d3472007856e7190d01e9fe7c6ad7cbc8237830e77376634b3731622eaf30d92e22a3886ff109279d9830dac727afb94a83ee6d8360cbdfa2cc0640';
    const key = await new Promise<Buffer>((resolve, reject) =>
      scrypt('password', 'NaCl', 64, { N: 1024, r: 8, p: 16 }, (e, k) => (e ? reject(e) : resolve(k))),
    );
    expect(key.toString('hex')).toBe(expected);
  });
});

describe('hashPassword / verifyPassword', () => {
  it('uses the OWASP parameters by default and verifies the right password only', async () => {
    expect(DEFAULT_SCRYPT).toEqual({ ln: 17, r: 8, p: 1 });
    const hash = await hashPassword('a long enough passphrase');
    expect(hash).toMatch(/^\$scrypt\$ln=17,r=8,p=1\$[A-Za-z0-9+/]{22}\$[A-Za-z0-9+/]{43}$/);
    expect(await verifyPassword('a long enough passphrase', hash)).toBe(true);
    expect(await verifyPassword('a long enough passphrasE', hash)).toBe(false);
    expect(needsRehash(hash)).toBe(false);
  }, 60_000);

  it('salts every hash: the same password hashes differently each time', async () => {
    const a = await hashPassword('same password here', FAST);
    const b = await hashPassword('same password here', FAST);
    expect(a).not.toBe(b);
    expect(await verifyPassword('same password here', a)).toBe(true);
    expect(await verifyPassword('same password here', b)).toBe(true);
  });

  it('normalises Unicode (NFKC) before hashing, and hashes the whole password', async () => {
    const composed = 'Bl\u00e5b\u00e6rsyltet\u00f8y p\u00e5 br\u00f8d';
    const decomposed = composed.normalize('NFD');
    expect(decomposed).not.toBe(composed);
    const hash = await hashPassword(composed, FAST);
    expect(await verifyPassword(decomposed, hash)).toBe(true);
    // No truncation: a long password differing only at its end is another password.
    const long = 'x'.repeat(500);
    const longHash = await hashPassword(`${long}a`, FAST);
    expect(await verifyPassword(`${long}b`, longHash)).toBe(false);
  });

  it('refuses hashes it cannot read or whose parameters would be a denial of service', async () => {
    const hash = await hashPassword('a long enough passphrase', FAST);
    expect(parsePasswordHash(hash)?.params).toEqual(FAST);
    for (const bad of [
      '',
      'plain text',
      hash.replace('$scrypt$', '$argon2id$'),
      hash.replace('ln=10', 'ln=30'), // 2^30 · 1 KiB = 1 TiB
      hash.replace('p=1', 'p=99'),
      hash.slice(0, -10) + '!!!!!!!!!!',
    ]) {
      expect(parsePasswordHash(bad)).toBeNull();
      expect(await verifyPassword('a long enough passphrase', bad)).toBe(false);
    }
    // A flipped bit in the stored key fails the constant-time comparison.
    const parsed = parsePasswordHash(hash)!;
    parsed.key[0] = parsed.key[0]! ^ 1;
    const tampered = `$scrypt$ln=10,r=8,p=1$${parsed.salt.toString('base64').replace(/=+$/, '')}$${parsed.key.toString('base64').replace(/=+$/, '')}`;
    expect(await verifyPassword('a long enough passphrase', tampered)).toBe(false);
  });

  it('asks for a re-hash when the parameters differ from the current ones', async () => {
    const hash = await hashPassword('a long enough passphrase', FAST);
    expect(needsRehash(hash)).toBe(true);
    expect(needsRehash(hash, FAST)).toBe(false);
    expect(needsRehash('garbage')).toBe(true);
  });

  it('keeps one dummy hash per parameter set, which no short password matches', async () => {
    const a = await dummyPasswordHash(FAST);
    expect(await dummyPasswordHash(FAST)).toBe(a);
    expect(await verifyPassword('', a)).toBe(false);
  });
});

describe('withHashSlot', () => {
  it('runs at most two hashes at once and runs every one of them', async () => {
    let running = 0;
    let most = 0;
    const task = () =>
      withHashSlot(async () => {
        running++;
        most = Math.max(most, running);
        await new Promise((r) => setTimeout(r, 5));
        running--;
      });
    await Promise.all(Array.from({ length: 9 }, task));
    expect(most).toBe(2);
    expect(running).toBe(0);
  });
});
