import { apiContext, type ApiContext } from '../api/context';

/**
 * What every page works with: the web app's pool, the fleet time zone and
 * today in it. The same as the API's context, so pages and API agree on
 * "today"; the access-control issue will add the signed-in user here.
 */
export type PageContext = ApiContext;

export function pageContext(): PageContext {
  return apiContext();
}
