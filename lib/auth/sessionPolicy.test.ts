import { describe, expect, it } from 'vitest';
import { hashSessionId, newSessionId, SESSION_ID_PATTERN } from './sessionId';
import { SESSION_IDLE_MS, SESSION_LIFETIME_MS, sessionState, shouldStamp } from './sessionPolicy';

const at = (minutes: number) => new Date(Date.UTC(2026, 0, 1, 8, 0) + minutes * 60_000);
const fresh = { createdAt: at(0), expiresAt: at(12 * 60), lastSeenAt: at(0), revokedAt: null };

describe('session ids', () => {
  it('are 32 random bytes in base64url, stored as SHA-256', () => {
    const a = newSessionId();
    expect(a).toMatch(SESSION_ID_PATTERN);
    expect(Buffer.from(a, 'base64url')).toHaveLength(32);
    expect(newSessionId()).not.toBe(a);
    // Source: FIPS 180-4 test vector, SHA-256("abc").
    expect(hashSessionId('abc')).toBe('ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad');
  });
});

describe('sessionState (NIST SP 800-63B rev. 3, 4.2.3: 12 h overall, 30 min idle)', () => {
  it('uses those limits', () => {
    expect(SESSION_LIFETIME_MS).toBe(12 * 3600_000);
    expect(SESSION_IDLE_MS).toBe(30 * 60_000);
  });

  it('is active while used, up to the absolute end', () => {
    expect(sessionState(fresh, at(0))).toBe('active');
    expect(sessionState(fresh, at(29))).toBe('active');
    // Activity keeps it alive …
    expect(sessionState({ ...fresh, lastSeenAt: at(12 * 60 - 5) }, at(12 * 60 - 1))).toBe('active');
    // … but not past 12 hours, however active.
    expect(sessionState({ ...fresh, lastSeenAt: at(12 * 60 - 1) }, at(12 * 60))).toBe('expired');
  });

  it('ends after 30 idle minutes', () => {
    expect(sessionState(fresh, at(30))).toBe('idle');
    expect(sessionState({ ...fresh, lastSeenAt: at(100) }, at(129))).toBe('active');
    expect(sessionState({ ...fresh, lastSeenAt: at(100) }, at(130))).toBe('idle');
  });

  it('ends when revoked, and revocation wins over the other reasons', () => {
    expect(sessionState({ ...fresh, revokedAt: at(5) }, at(6))).toBe('revoked');
    expect(sessionState({ ...fresh, revokedAt: at(5) }, at(24 * 60))).toBe('revoked');
  });

  it('stamps last_seen_at at most once a minute', () => {
    expect(shouldStamp(at(0), new Date(at(0).getTime() + 59_999))).toBe(false);
    expect(shouldStamp(at(0), at(1))).toBe(true);
  });
});
