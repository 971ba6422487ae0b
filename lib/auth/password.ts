import { randomBytes, scrypt, timingSafeEqual, type ScryptOptions } from 'node:crypto';

/**
 * Password hashing with scrypt (RFC 7914), a memory-hard function, through
 * node:crypto (OpenSSL's implementation).
 *
 * Parameters: N = 2^17, r = 8, p = 1 — 128 MiB and a few hundred
 * milliseconds per hash on a server core. Source: OWASP Password Storage
 * Cheat Sheet ("use scrypt with a minimum CPU/memory cost parameter of
 * (2^17), a minimum block size of 8 (1024 bytes), and a parallelization
 * parameter of 1"). Memory per hash is 128·N·r bytes (RFC 7914 section 6).
 * Salt: 16 random bytes per hash; key: 32 bytes.
 *
 * Stored as a PHC string (github.com/P-H-C/phc-string-format):
 * `$scrypt$ln=17,r=8,p=1$<salt>$<hash>`, base64 without padding. The
 * parameters travel with the hash, so raising them later keeps old hashes
 * working; `needsRehash` tells the sign-in to re-hash on the next success.
 *
 * At most two hashes run at once: each takes 128 MiB and a libuv thread,
 * and a burst of sign-ins must neither exhaust memory nor starve the other
 * users of the thread pool (common practice, no source).
 */

export interface ScryptParams {
  /** log2 of N, the CPU/memory cost. */
  ln: number;
  r: number;
  p: number;
}

export const DEFAULT_SCRYPT: ScryptParams = { ln: 17, r: 8, p: 1 };
const SALT_BYTES = 16;
const KEY_BYTES = 32;

// Refuse parameters that would make one verification a denial of service
// (a damaged or planted row): up to 1 GiB and p ≤ 16.
const MAX_LN = 20;
const MAX_P = 16;
const MAX_R = 32;

const PHC = /^\$scrypt\$ln=(\d{1,2}),r=(\d{1,3}),p=(\d{1,3})\$([A-Za-z0-9+/]+)\$([A-Za-z0-9+/]+)$/;

/**
 * NIST SP 800-63B (rev. 3, 5.1.1.2; rev. 4, 3.1.1.2) asks verifiers to apply
 * Unicode normalisation (NFKC or NFKD) before hashing, so that the same
 * password typed on two keyboards gives the same bytes.
 */
function passwordBytes(password: string): Buffer {
  return Buffer.from(password.normalize('NFKC'), 'utf8');
}

function scryptAsync(password: Buffer, salt: Buffer, keyLength: number, params: ScryptParams): Promise<Buffer> {
  const N = 2 ** params.ln;
  // Node refuses work above `maxmem`; allow the memory these parameters need, with room.
  const options: ScryptOptions = { N, r: params.r, p: params.p, maxmem: 2 * 128 * N * params.r + 1024 * 1024 };
  return new Promise((resolve, reject) => scrypt(password, salt, keyLength, options, (error, key) => (error ? reject(error) : resolve(key))));
}

// A two-slot semaphore around scrypt (see above); exported for its test.
const MAX_PARALLEL = 2;
let running = 0;
const waiting: (() => void)[] = [];
export async function withHashSlot<T>(work: () => Promise<T>): Promise<T> {
  // A finishing task hands its slot straight to the next waiter, so no newcomer can slip in between.
  if (running >= MAX_PARALLEL) await new Promise<void>((resolve) => waiting.push(resolve));
  else running++;
  try {
    return await work();
  } finally {
    const next = waiting.shift();
    if (next) next();
    else running--;
  }
}

const b64 = (bytes: Buffer) => bytes.toString('base64').replace(/=+$/, '');

export async function hashPassword(password: string, params: ScryptParams = DEFAULT_SCRYPT): Promise<string> {
  const salt = randomBytes(SALT_BYTES);
  const key = await withHashSlot(() => scryptAsync(passwordBytes(password), salt, KEY_BYTES, params));
  return `$scrypt$ln=${params.ln},r=${params.r},p=${params.p}$${b64(salt)}$${b64(key)}`;
}

export interface ParsedHash {
  params: ScryptParams;
  salt: Buffer;
  key: Buffer;
}

/** The parts of a stored hash, or null when it is not one this code wrote or would accept. */
export function parsePasswordHash(encoded: string): ParsedHash | null {
  const m = PHC.exec(encoded);
  if (!m) return null;
  const params = { ln: Number(m[1]), r: Number(m[2]), p: Number(m[3]) };
  if (params.ln < 1 || params.ln > MAX_LN || params.r < 1 || params.r > MAX_R || params.p < 1 || params.p > MAX_P) return null;
  const salt = Buffer.from(m[4]!, 'base64');
  const key = Buffer.from(m[5]!, 'base64');
  if (salt.length < 8 || key.length < 16) return null;
  return { params, salt, key };
}

/** True when `password` matches `encoded`; false for a wrong password or a hash it cannot read. */
export async function verifyPassword(password: string, encoded: string): Promise<boolean> {
  const parsed = parsePasswordHash(encoded);
  if (!parsed) return false;
  const key = await withHashSlot(() => scryptAsync(passwordBytes(password), parsed.salt, parsed.key.length, parsed.params));
  // Constant-time comparison: the time taken says nothing about how much matched.
  return timingSafeEqual(key, parsed.key);
}

/** True when the hash was made with other parameters than `params` (re-hash after the next sign-in). */
export function needsRehash(encoded: string, params: ScryptParams = DEFAULT_SCRYPT): boolean {
  const parsed = parsePasswordHash(encoded);
  return !parsed || parsed.params.ln !== params.ln || parsed.params.r !== params.r || parsed.params.p !== params.p;
}

/**
 * A hash of a random password nobody knows. Checking a sign-in for an
 * unknown e-mail address against it takes as long as checking a real one, so
 * the answer time does not tell which addresses have accounts (OWASP
 * Authentication Cheat Sheet, "Authentication and Error Messages").
 */
const dummyHashes = new Map<string, Promise<string>>();
export function dummyPasswordHash(params: ScryptParams = DEFAULT_SCRYPT): Promise<string> {
  const key = `${params.ln},${params.r},${params.p}`;
  let hash = dummyHashes.get(key);
  if (!hash) {
    hash = hashPassword(randomBytes(32).toString('base64'), params);
    dummyHashes.set(key, hash);
  }
  return hash;
}
