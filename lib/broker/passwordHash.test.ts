import { describe, expect, it } from 'vitest';
import { generateMqttPassword, hashMosquittoPassword, MOSQUITTO_ITERATIONS, verifyMosquittoPassword } from './passwordHash';

describe("Mosquitto's $7$ password hash", () => {
  it('writes $7$101$<12-byte salt>$<64-byte PBKDF2-HMAC-SHA512>, as mosquitto_passwd does', async () => {
    expect(MOSQUITTO_ITERATIONS).toBe(101);
    const hash = await hashMosquittoPassword('correct horse');
    expect(hash).toMatch(/^\$7\$101\$[A-Za-z0-9+/]{16}\$[A-Za-z0-9+/]{86}==$/);
    expect(await verifyMosquittoPassword('correct horse', hash)).toBe(true);
    expect(await verifyMosquittoPassword('correct horsE', hash)).toBe(false);
  });

  it('verifies a line written by mosquitto_passwd 2.0.11 (password "correct horse")', async () => {
    // Made with: mosquitto_passwd -c -b pw alice 'correct horse'
    const written = '$7$101$6bXwmMtIQzhcPDH5$2f0ZrJih4sjKJ4taHymG4wgzOt/4ybmL9zdzTKJ36fPgdwFGLWIk9vPOAFm5ra/Z55S1jL6movrslCu1Vgb5SA==';
    expect(await verifyMosquittoPassword('correct horse', written)).toBe(true);
    expect(await verifyMosquittoPassword('correct horse ', written)).toBe(false);
  });

  it('honours the iteration count written in the hash', async () => {
    const hash = await hashMosquittoPassword('pw', 1000);
    expect(hash.startsWith('$7$1000$')).toBe(true);
    expect(await verifyMosquittoPassword('pw', hash)).toBe(true);
    expect(await verifyMosquittoPassword('pw', hash.replace('$7$1000$', '$7$1001$'))).toBe(false);
  });

  it('refuses hashes it cannot read, and iteration counts that would stall the broker', async () => {
    const hash = await hashMosquittoPassword('pw');
    for (const bad of ['', 'pw', hash.replace('$7$', '$6$'), hash.replace('$7$101$', '$7$9999999$'), hash.replace('$7$101$', '$7$0$'), hash.slice(0, -6)]) {
      expect(await verifyMosquittoPassword('pw', bad)).toBe(false);
    }
  });

  it('generates 256-bit passwords that fit a password file line', () => {
    const a = generateMqttPassword();
    expect(a).toMatch(/^[A-Za-z0-9_-]{43}$/);
    expect(Buffer.from(a, 'base64url')).toHaveLength(32);
    expect(generateMqttPassword()).not.toBe(a);
  });
});
