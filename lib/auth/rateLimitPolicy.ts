import { isIP } from 'node:net';

/**
 * Sign-in rate limits: sliding windows over the failed attempts recorded in
 * login_attempt (so every web process counts the same attempts).
 *
 * - Per account (the e-mail typed): at most 10 failures in 15 minutes, and a
 *   successful sign-in starts the count again. NIST SP 800-63B (rev. 3,
 *   5.2.2; rev. 4, 3.2.2) caps consecutive failures on one account at 100;
 *   10 per quarter hour is far below that and rarely met by a person.
 * - Per client address: at most 50 failures in 15 minutes whoever they were
 *   for, against one address spraying many accounts. Higher than the account
 *   limit because an office or a ship's satellite link puts many people
 *   behind one address. A success does not reset it (an attacker with one
 *   account of their own must not be able to clear it).
 *
 * A refused ("limited") attempt is not checked and not counted: the limit
 * bounds the number of password guesses, and a blocked account frees itself
 * once its oldest counted failure leaves the window. The numbers are common
 * practice, no source beyond the NIST cap.
 */
export interface RateLimitPolicy {
  windowMs: number;
  perAccount: number;
  perAddress: number;
}

export const LOGIN_RATE_LIMIT: RateLimitPolicy = { windowMs: 15 * 60_000, perAccount: 10, perAddress: 50 };

export type RateDecision = { allowed: true } | { allowed: false; retryAfterS: number; by: 'account' | 'address' };

/**
 * Whether one more attempt may be checked, given the times of the failures
 * counted against the account and the address, newest first (only those in
 * the window matter; more than the limit need not be passed).
 */
export function decideRate(
  failures: { account: readonly Date[]; address: readonly Date[] },
  now: Date,
  policy: RateLimitPolicy = LOGIN_RATE_LIMIT,
): RateDecision {
  const since = now.getTime() - policy.windowMs;
  const check = (times: readonly Date[], limit: number) => {
    const inWindow = times.filter((t) => t.getTime() > since).sort((a, b) => b.getTime() - a.getTime());
    if (inWindow.length < limit) return null;
    // Allowed again once the limit-th newest failure leaves the window.
    const frees = inWindow[limit - 1]!.getTime() + policy.windowMs;
    return Math.max(1, Math.ceil((frees - now.getTime()) / 1000));
  };
  const account = check(failures.account, policy.perAccount);
  const address = check(failures.address, policy.perAddress);
  if (account === null && address === null) return { allowed: true };
  if (address === null || (account !== null && account >= address)) return { allowed: false, retryAfterS: account!, by: 'account' };
  return { allowed: false, retryAfterS: address, by: 'address' };
}

/**
 * The key an address is counted under. IPv4: the address. IPv6: its /64
 * network, because one subscriber is usually given a whole /64 and could
 * otherwise take a fresh address per attempt (common practice, no source).
 * An IPv4-mapped IPv6 address counts as the IPv4 address.
 */
/** The key of every attempt whose address is not known; it is not limited as an address. */
export const UNKNOWN_ADDRESS = 'unknown';

export function addressKey(address: string | null | undefined): string {
  const text = (address ?? '').trim();
  const mapped = /^::ffff:(\d{1,3}(?:\.\d{1,3}){3})$/i.exec(text);
  if (mapped && isIP(mapped[1]!) === 4) return mapped[1]!;
  if (isIP(text) === 4) return text;
  if (isIP(text) === 6) return `${expandIpv6(text).slice(0, 4).join(':')}::/64`;
  return UNKNOWN_ADDRESS;
}

function expandIpv6(address: string): string[] {
  const [head, tail] = address.toLowerCase().split('::') as [string, string | undefined];
  const part = (s: string | undefined) => (s ? s.split(':') : []);
  // A trailing embedded IPv4 (::1.2.3.4) takes two groups; only the first four groups are used, so it is dropped.
  const left = part(head);
  const right = part(tail).filter((g) => !g.includes('.'));
  const missing = tail === undefined ? 0 : 8 - left.length - right.length;
  return [...left, ...Array(Math.max(0, missing)).fill('0'), ...right].map((g) => Number.parseInt(g || '0', 16).toString(16));
}

/** E-mail addresses are counted without case and surrounding spaces, at most 320 characters (RFC 5321 limits). */
export function accountKey(email: string): string {
  return email.trim().toLowerCase().slice(0, 320);
}
