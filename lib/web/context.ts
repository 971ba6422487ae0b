import { notFound, redirect } from 'next/navigation';
import { can, type Action } from '../auth/permissions';
import { apiContext, type ApiContext } from '../api/context';
import type { UserPrincipal } from '../auth/principal';
import type { Scope } from '../auth/scope';
import { scopeOf } from '../auth/scopeData';
import { requestSession } from './requestSession';

/**
 * What every page works with: the web app's pool, the fleet time zone and
 * today in it (the same as the API's context, so pages and API agree on
 * "today"), and the signed-in user with its scope and CSRF token.
 *
 * Every page calls this first: without a live session it redirects to
 * /signin (an expired, revoked or unknown session alike), so no page reads
 * fleet data for a visitor who is not signed in.
 */
export interface PageContext extends ApiContext {
  principal: UserPrincipal;
  scope: Scope;
  /** Goes into every form that changes something (lib/auth/csrf.ts). */
  csrfToken: string;
}

export async function pageContext(): Promise<PageContext> {
  const api = apiContext();
  const session = await requestSession(api.db);
  if (!session.check.ok) redirect('/signin');
  const { principal, csrfToken } = session.check;
  return { ...api, principal, scope: await scopeOf(api.db, principal), csrfToken };
}

/** A page for one kind of change (admin pages): 404 for a user whose role may not make it, so the page is not advertised. */
export async function pageContextFor(action: Action): Promise<PageContext> {
  const ctx = await pageContext();
  if (!can(ctx.principal, action)) notFound();
  return ctx;
}

/**
 * Fleet-wide screens (ranking, reception) score and count the whole fleet
 * over rolling windows; a charterer sees only some vessels on some days, so
 * it is sent to its campaigns instead.
 */
export async function fleetPageContext(): Promise<PageContext> {
  const ctx = await pageContext();
  if (ctx.scope.kind !== 'fleet') redirect('/campaigns');
  return ctx;
}
