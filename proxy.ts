import { NextResponse, type NextRequest } from 'next/server';
import { SESSION_COOKIE_LOCAL, SESSION_COOKIE_SECURE } from './lib/auth/sessionCookie';

/**
 * An early, optimistic check (Next.js Proxy, run before a page renders): a
 * page request without any session cookie is sent to /signin at once, with
 * a real 307, before a page's loading screen is streamed. Whether a cookie
 * that is present is still a live session is decided by every page itself
 * (lib/web/context.ts pageContext), against the store; this file reads no
 * database and decides nothing else.
 */
export function proxy(request: NextRequest): NextResponse {
  if (request.cookies.has(SESSION_COOKIE_SECURE) || request.cookies.has(SESSION_COOKIE_LOCAL)) return NextResponse.next();
  return NextResponse.redirect(new URL('/signin', request.url), 307);
}

export const config = {
  // Pages only: not the API (401 of its own), the sign-in and sign-out routes, the sign-in page, or static files.
  matcher: ['/((?!api/|auth/|signin|_next/|icon\\.svg|favicon\\.ico).*)'],
};
