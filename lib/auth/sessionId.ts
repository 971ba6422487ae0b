import { createHash, randomBytes } from 'node:crypto';

/**
 * Session identifiers: 32 random bytes from the operating system's CSPRNG,
 * sent as base64url in the cookie (43 characters), stored only as their
 * SHA-256. OWASP Session Management Cheat Sheet ("Session ID Entropy"): at
 * least 64 bits of entropy; 256 bits leave no room for guessing. A stolen
 * copy of user_session yields hashes, and no cookie can be made from them.
 */
export const SESSION_ID_PATTERN = /^[A-Za-z0-9_-]{43}$/;

export function newSessionId(): string {
  return randomBytes(32).toString('base64url');
}

export function hashSessionId(sessionId: string): string {
  return createHash('sha256').update(sessionId, 'utf8').digest('hex');
}
