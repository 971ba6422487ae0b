import { checkCsrf, CSRF_FIELD } from '../auth/csrf';
import { can, type Action } from '../auth/permissions';
import type { UserPrincipal } from '../auth/principal';
import { getSharedPool } from '../db/sharedPool';
import { requestSession } from './requestSession';

/**
 * The gate of every server action that changes something: a live session,
 * both CSRF checks (lib/auth/csrf.ts: same origin, and the form's
 * csrf_token bound to the session), and the role's permission
 * (lib/auth/permissions.ts). Pages hide the forms a role may not use; this
 * refuses them anyway, since a form can be posted without its page.
 */
export type ActionGate = { ok: true; principal: UserPrincipal; ip: string | null } | { ok: false; message: string };

export async function guardAction(form: FormData, action: Action): Promise<ActionGate> {
  const session = await requestSession(getSharedPool());
  if (!session.check.ok) return { ok: false, message: 'Your session has ended: sign in again.' };
  const submitted = form.get(CSRF_FIELD);
  const csrf = checkCsrf({
    method: 'POST',
    expectedOrigin: session.origin,
    origin: session.headers.get('origin'),
    referer: session.headers.get('referer'),
    secFetchSite: session.headers.get('sec-fetch-site'),
    sessionId: session.sessionId,
    submittedToken: typeof submitted === 'string' ? submitted : null,
  });
  if (!csrf.ok) return { ok: false, message: 'This form is out of date or came from another site: reload the page and try again.' };
  if (!can(session.check.principal, action)) return { ok: false, message: 'Your role may not do this.' };
  return { ok: true, principal: session.check.principal, ip: session.ip };
}
