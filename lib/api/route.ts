import type { Principal } from '../auth/principal';
import type { Scope } from '../auth/scope';
import { scopeOf } from '../auth/scopeData';
import { authenticateRequest } from './auth';
import { apiContext, type ApiContext } from './context';
import { ApiError } from './errors';
import { errorResponse } from './render';

/**
 * The one wrapper every /api/v1 data route goes through: context, then the
 * caller (before anything else, so an unauthenticated caller learns nothing,
 * not even whether a vessel key exists), then the caller's scope
 * (lib/auth/scope.ts), then the handler; any error becomes the API's error
 * answer.
 */

export interface RouteInput<P> {
  request: Request;
  search: URLSearchParams;
  params: P;
  ctx: ApiContext;
  principal: Principal;
  /** What the caller may see; every handler filters its answer with it (lib/api/scoped.ts). */
  scope: Scope;
}

/** The second argument Next.js passes to a route handler (Next 15+: params is a promise). */
export interface HandlerContext<P> {
  params: Promise<P>;
}

export type NoParams = Record<string, never>;

export function apiRoute<P extends Record<string, string>>(
  handle: (input: RouteInput<P>) => Promise<Response>,
): (request: Request, context: HandlerContext<P>) => Promise<Response> {
  return async (request, context) => {
    try {
      const ctx = apiContext();
      const principal = await authenticateRequest(ctx.db, request);
      const scope = await scopeOf(ctx.db, principal);
      const search = new URL(request.url).searchParams;
      return await handle({ request, search, params: await context.params, ctx, principal, scope });
    } catch (error) {
      if (error instanceof ApiError) return errorResponse(error);
      // Unexpected (the store is down, a bug): logged in full on the server,
      // answered without detail.
      console.error('api: unexpected error', error);
      return errorResponse(new ApiError('internal_error', 'internal error; the server log has the details'));
    }
  };
}
