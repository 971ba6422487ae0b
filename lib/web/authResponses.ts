import { checkCsrf, CSRF_FIELD } from '../auth/csrf';
import { clearedSessionCookie, sessionCookie, setCookieHeader } from '../auth/sessionCookie';
import { clientAddress, cookieValue, requestOrigin, secureCookieFor } from '../auth/sessionRequest';
import { loadConfig } from '../config';
import { sessionCookieName } from '../auth/sessionCookie';

/**
 * What the sign-in and sign-out route handlers share: reading the posted
 * form and the request's origin, the CSRF check, and the 303 answers that
 * send the browser on (POST → redirect → GET, so a reload never posts
 * twice).
 */

export interface AuthRequest {
  form: FormData;
  origin: string;
  secure: boolean;
  sessionId: string | null;
  ip: string | null;
  userAgent: string | null;
}

export async function readAuthRequest(request: Request): Promise<AuthRequest> {
  const origin = requestOrigin(request.headers, request.url);
  const secure = secureCookieFor(origin);
  let form: FormData;
  try {
    form = await request.formData();
  } catch {
    form = new FormData(); // not a form: every field missing, refused below
  }
  return {
    form,
    origin,
    secure,
    sessionId: cookieValue(request.headers.get('cookie'), sessionCookieName(secure)),
    ip: clientAddress(request.headers, loadConfig().HOLDFAST_TRUST_PROXY),
    userAgent: request.headers.get('user-agent'),
  };
}

/** CSRF for the auth forms; sign-in has no session yet, so only the origin check (login CSRF). */
export function authCsrfOk(request: Request, auth: AuthRequest, requireToken: boolean): boolean {
  const token = auth.form.get(CSRF_FIELD);
  return checkCsrf(
    {
      method: request.method,
      expectedOrigin: auth.origin,
      origin: request.headers.get('origin'),
      referer: request.headers.get('referer'),
      secFetchSite: request.headers.get('sec-fetch-site'),
      sessionId: auth.sessionId,
      submittedToken: typeof token === 'string' ? token : null,
    },
    { requireToken },
  ).ok;
}

/** 303 to a path of this app, optionally setting or clearing the session cookie. */
export function seeOther(auth: AuthRequest, path: string, cookie?: { set: string } | { clear: true }): Response {
  const headers = new Headers({ location: new URL(path, auth.origin).toString(), 'cache-control': 'no-store' });
  if (cookie) headers.append('set-cookie', setCookieHeader('set' in cookie ? sessionCookie(cookie.set, auth.secure) : clearedSessionCookie(auth.secure)));
  return new Response(null, { status: 303, headers });
}

/** Only a path of this app (starting with one "/") may be the page to return to after sign-in. */
export function safeReturnPath(value: FormDataEntryValue | null): string {
  return typeof value === 'string' && /^\/(?![/\\])/.test(value) ? value : '/';
}

/** A form that failed the CSRF checks: refused outright, nothing changed. */
export function csrfRefused(): Response {
  return new Response('Refused: this form came from another site or is out of date. Reload the page and try again.\n', {
    status: 403,
    headers: { 'content-type': 'text/plain; charset=utf-8', 'cache-control': 'no-store' },
  });
}
