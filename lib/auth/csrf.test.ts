import { describe, expect, it } from 'vitest';
import { checkCsrf, csrfTokenFor, type CsrfRequest } from './csrf';
import { newSessionId } from './sessionId';

const APP = 'https://holdfast.example.com';
const session = newSessionId();
const good: CsrfRequest = {
  method: 'POST',
  expectedOrigin: APP,
  origin: APP,
  referer: null,
  secFetchSite: 'same-origin',
  sessionId: session,
  submittedToken: csrfTokenFor(session),
};

describe('csrfTokenFor', () => {
  it('is fixed for a session, differs between sessions, and is not the session id', () => {
    const other = newSessionId();
    expect(csrfTokenFor(session)).toBe(csrfTokenFor(session));
    expect(csrfTokenFor(other)).not.toBe(csrfTokenFor(session));
    expect(csrfTokenFor(session)).not.toContain(session);
    expect(csrfTokenFor(session)).toMatch(/^[A-Za-z0-9_-]{43}$/);
  });
});

describe('checkCsrf', () => {
  it('lets a same-origin form post with its session token through', () => {
    expect(checkCsrf(good)).toEqual({ ok: true });
    // Without Fetch Metadata (older browsers) Origin alone decides where it came from.
    expect(checkCsrf({ ...good, secFetchSite: null })).toEqual({ ok: true });
    // Without Origin, the Referer's origin stands in.
    expect(checkCsrf({ ...good, origin: null, referer: `${APP}/watchlist?status=open` })).toEqual({ ok: true });
    // Default port and case are the same origin.
    expect(checkCsrf({ ...good, expectedOrigin: 'https://HOLDFAST.example.com:443/' })).toEqual({ ok: true });
  });

  it('never checks safe methods', () => {
    for (const method of ['GET', 'head', 'OPTIONS']) {
      expect(checkCsrf({ ...good, method, origin: 'https://evil.example', sessionId: null, submittedToken: null })).toEqual({ ok: true });
    }
  });

  it.each([
    ['a cross-site request (Fetch Metadata)', { secFetchSite: 'cross-site' }, 'cross_site'],
    ['a same-site but other-origin request', { secFetchSite: 'same-site' }, 'cross_site'],
    ['another origin', { origin: 'https://evil.example' }, 'origin_mismatch'],
    ['another port of the same host', { origin: 'https://holdfast.example.com:8443' }, 'origin_mismatch'],
    ['plain http to an https app', { origin: 'http://holdfast.example.com' }, 'origin_mismatch'],
    ['an opaque origin', { origin: 'null', secFetchSite: null }, 'origin_mismatch'],
    ['no Origin and no Referer', { origin: null, referer: null }, 'no_origin'],
    ['a foreign Referer without Origin', { origin: null, referer: 'https://evil.example/page' }, 'origin_mismatch'],
    ['no session cookie', { sessionId: null }, 'no_session'],
    ['no token', { submittedToken: null }, 'token_missing'],
    ['an empty token', { submittedToken: '' }, 'token_missing'],
    ['the token of another session', { submittedToken: csrfTokenFor(newSessionId()) }, 'token_mismatch'],
    ['the session id itself as token', { submittedToken: session }, 'token_mismatch'],
    ['a truncated token', { submittedToken: csrfTokenFor(session).slice(0, 20) }, 'token_mismatch'],
  ] as const)('refuses %s', (_, change, reason) => {
    expect(checkCsrf({ ...good, ...change })).toEqual({ ok: false, reason });
  });

  it('checks sign-in (no session yet) by origin only', () => {
    const signIn = { ...good, sessionId: null, submittedToken: null };
    expect(checkCsrf(signIn, { requireToken: false })).toEqual({ ok: true });
    expect(checkCsrf({ ...signIn, origin: 'https://evil.example' }, { requireToken: false })).toEqual({ ok: false, reason: 'origin_mismatch' });
    expect(checkCsrf({ ...signIn, secFetchSite: 'cross-site' }, { requireToken: false })).toEqual({ ok: false, reason: 'cross_site' });
  });
});
