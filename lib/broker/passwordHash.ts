import { pbkdf2, randomBytes, timingSafeEqual } from 'node:crypto';

/**
 * MQTT passwords hashed the way Mosquitto 2 stores them, so that one stored
 * hash serves both the embedded broker and an exported Mosquitto password
 * file. Source: eclipse/mosquitto, apps/mosquitto_passwd/mosquitto_passwd.c
 * (`output_new_password` writes `username:$7$<iterations>$<salt>$<hash>`)
 * and its password header (type 7 = "sha512-pbkdf2", SALT_LEN 12,
 * PW_DEFAULT_ITERATIONS 101): PBKDF2 (RFC 8018) with HMAC-SHA512, a 12-byte
 * salt, a 64-byte key, salt and key in standard base64 with padding. Checked
 * against the real `mosquitto_passwd` in test/brokerPasswordFile.test.ts.
 *
 * Why 101 iterations (Mosquitto's default) is enough here: these passwords
 * are never chosen by people. `generateMqttPassword` draws 32 random bytes
 * (256 bits), so there is no dictionary to try and no iteration count would
 * change the cost of a brute force that is already out of reach; slow hashes
 * exist for memorised secrets (NIST SP 800-63B rev. 3, 5.1.1.2, "Memorized
 * Secret Verifiers"). A low count also keeps a stream of bogus CONNECTs from
 * costing the broker much CPU. Human passwords use scrypt (lib/auth/password.ts).
 */
export const MOSQUITTO_ITERATIONS = 101;
const SALT_BYTES = 12;
const KEY_BYTES = 64;
// Iteration counts above this in a stored hash are refused: verifying would be a denial of service.
const MAX_ITERATIONS = 1_000_000;

const ENCODED = /^\$7\$(\d{1,7})\$([A-Za-z0-9+/]+={0,2})\$([A-Za-z0-9+/]+={0,2})$/;

function derive(password: string, salt: Buffer, iterations: number, length: number): Promise<Buffer> {
  return new Promise((resolve, reject) => pbkdf2(Buffer.from(password, 'utf8'), salt, iterations, length, 'sha512', (e, key) => (e ? reject(e) : resolve(key))));
}

/** A new random MQTT password: 32 bytes in base64url (43 characters, no ":" and no spaces). */
export function generateMqttPassword(): string {
  return randomBytes(32).toString('base64url');
}

export async function hashMosquittoPassword(password: string, iterations = MOSQUITTO_ITERATIONS): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await derive(password, salt, iterations, KEY_BYTES);
  return `$7$${iterations}$${salt.toString('base64')}$${key.toString('base64')}`;
}

/** True when `password` matches a `$7$` hash (ours or one written by mosquitto_passwd). */
export async function verifyMosquittoPassword(password: string, encoded: string): Promise<boolean> {
  const m = ENCODED.exec(encoded);
  if (!m) return false;
  const iterations = Number(m[1]);
  if (iterations < 1 || iterations > MAX_ITERATIONS) return false;
  const salt = Buffer.from(m[2]!, 'base64');
  const expected = Buffer.from(m[3]!, 'base64');
  if (salt.length === 0 || expected.length !== KEY_BYTES) return false;
  const key = await derive(password, salt, iterations, KEY_BYTES);
  return timingSafeEqual(key, expected);
}
