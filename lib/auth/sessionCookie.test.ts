import { describe, expect, it } from 'vitest';
import { clearedSessionCookie, needsSecureCookie, sessionCookie, setCookieHeader } from './sessionCookie';

describe('the session cookie', () => {
  it('is Secure with the __Host- prefix everywhere except plain http on this machine', () => {
    expect(needsSecureCookie('https://holdfast.example.com')).toBe(true);
    expect(needsSecureCookie('http://holdfast.example.com')).toBe(true);
    expect(needsSecureCookie('http://10.0.0.5:3000')).toBe(true);
    expect(needsSecureCookie('https://localhost:3000')).toBe(true);
    expect(needsSecureCookie('http://localhost:3000')).toBe(false);
    expect(needsSecureCookie('http://127.0.0.1:3000')).toBe(false);
    expect(needsSecureCookie('http://[::1]:3000')).toBe(false);
    expect(sessionCookie('abc', true).name).toBe('__Host-holdfast_session');
    expect(sessionCookie('abc', false).name).toBe('holdfast_session');
  });

  it('is HttpOnly, SameSite=Lax, for the whole site, for 12 hours', () => {
    expect(sessionCookie('abc', true)).toEqual({
      name: '__Host-holdfast_session',
      value: 'abc',
      httpOnly: true,
      sameSite: 'lax',
      secure: true,
      path: '/',
      maxAge: 43_200,
    });
    expect(setCookieHeader(sessionCookie('abc', true))).toBe('__Host-holdfast_session=abc; Path=/; Max-Age=43200; HttpOnly; SameSite=Lax; Secure');
    expect(setCookieHeader(sessionCookie('abc', false))).toBe('holdfast_session=abc; Path=/; Max-Age=43200; HttpOnly; SameSite=Lax');
  });

  it('is emptied and expired on sign-out', () => {
    expect(setCookieHeader(clearedSessionCookie(true))).toBe('__Host-holdfast_session=; Path=/; Max-Age=0; HttpOnly; SameSite=Lax; Secure');
  });
});
