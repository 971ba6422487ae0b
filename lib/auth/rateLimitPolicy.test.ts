import { describe, expect, it } from 'vitest';
import { accountKey, addressKey, decideRate, LOGIN_RATE_LIMIT } from './rateLimitPolicy';

const now = new Date('2026-01-01T12:00:00Z');
const ago = (s: number) => new Date(now.getTime() - s * 1000);
const times = (n: number, everyS: number, startS = 0) => Array.from({ length: n }, (_, i) => ago(startS + i * everyS));

describe('decideRate (sliding 15-minute windows)', () => {
  it('allows up to 9 recent failures of an account, refuses the 10th', () => {
    expect(LOGIN_RATE_LIMIT).toEqual({ windowMs: 900_000, perAccount: 10, perAddress: 50 });
    expect(decideRate({ account: times(9, 10), address: [] }, now)).toEqual({ allowed: true });
    const refused = decideRate({ account: times(10, 10), address: [] }, now);
    // The 10th newest failure was 90 s ago: free again 810 s from now.
    expect(refused).toEqual({ allowed: false, retryAfterS: 810, by: 'account' });
  });

  it('forgets failures that left the window', () => {
    expect(decideRate({ account: times(10, 60, 400), address: [] }, now)).toEqual({ allowed: true }); // the 10th is 940 s old
    expect(decideRate({ account: times(10, 1, 900), address: [] }, now)).toEqual({ allowed: true }); // exactly 15 min is out
  });

  it('limits one address across accounts at 50', () => {
    expect(decideRate({ account: [], address: times(49, 5) }, now)).toEqual({ allowed: true });
    expect(decideRate({ account: [], address: times(50, 5) }, now)).toEqual({ allowed: false, retryAfterS: 900 - 245, by: 'address' });
  });

  it('reports the longer wait when both limits are reached', () => {
    const d = decideRate({ account: times(10, 1), address: times(50, 1, 600) }, now);
    expect(d).toEqual({ allowed: false, retryAfterS: 891, by: 'account' });
  });

  it('never asks to wait less than a second', () => {
    expect(decideRate({ account: times(10, 0, 899.9), address: [] }, now)).toEqual({ allowed: false, retryAfterS: 1, by: 'account' });
  });
});

describe('the keys attempts are counted under', () => {
  it('counts an IPv6 address by its /64 and a mapped IPv4 as IPv4', () => {
    expect(addressKey('203.0.113.7')).toBe('203.0.113.7');
    expect(addressKey('::ffff:203.0.113.7')).toBe('203.0.113.7');
    expect(addressKey('2001:db8:aa:bb:1:2:3:4')).toBe('2001:db8:aa:bb::/64');
    expect(addressKey('2001:db8:aa:bb::9')).toBe('2001:db8:aa:bb::/64');
    expect(addressKey('2001:DB8:00aa:bb:ffff::')).toBe('2001:db8:aa:bb::/64');
    expect(addressKey('2001:db8::1')).toBe('2001:db8:0:0::/64');
    expect(addressKey('::1')).toBe('0:0:0:0::/64');
    expect(addressKey('not an address')).toBe('unknown');
    expect(addressKey(null)).toBe('unknown');
  });

  it('counts e-mail addresses without case or spaces', () => {
    expect(accountKey('  Ingrid@Example.COM ')).toBe('ingrid@example.com');
  });
});
