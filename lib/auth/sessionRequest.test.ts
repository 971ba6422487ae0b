import { describe, expect, it } from 'vitest';
import { clientAddress } from './sessionRequest';

const headersOf = (entries: Record<string, string>) => new Headers(entries);

describe('clientAddress', () => {
  it('believes no forwarding header unless a proxy is trusted: a direct client can write them', () => {
    expect(clientAddress(headersOf({ 'x-forwarded-for': '203.0.113.9' }), false)).toBeNull();
    expect(clientAddress(headersOf({ 'x-real-ip': '203.0.113.9' }), false)).toBeNull();
    expect(clientAddress(headersOf({}), false)).toBeNull();
  });

  it('behind a trusted proxy takes the entry the proxy appended, the last, not what the client sent before it', () => {
    // The client forged "198.51.100.1"; the proxy appended the address it saw.
    expect(clientAddress(headersOf({ 'x-forwarded-for': '198.51.100.1, 203.0.113.9' }), true)).toBe('203.0.113.9');
    expect(clientAddress(headersOf({ 'x-forwarded-for': ' 2001:db8::5 ' }), true)).toBe('2001:db8::5');
    expect(clientAddress(headersOf({ 'x-real-ip': '203.0.113.10' }), true)).toBe('203.0.113.10');
    expect(clientAddress(headersOf({ 'x-forwarded-for': ' , ' }), true)).toBeNull();
  });
});
