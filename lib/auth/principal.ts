import type { Role } from './roles';

/**
 * Who is asking: a signed-in user (a session cookie) or an API token (a
 * bearer header). Both carry a role; a charterer user carries its
 * organisation, a charterer token its one campaign. Everything that decides
 * what may be seen or done (scope.ts, permissions.ts) takes this and nothing
 * else, so pages, the API, exports and actions all ask the same question.
 */
export type Principal = UserPrincipal | TokenPrincipal;

export interface UserPrincipal {
  kind: 'user';
  userId: number;
  email: string;
  role: Role;
  organisationId: number | null;
}

export interface TokenPrincipal {
  kind: 'token';
  tokenId: number;
  role: Role;
  campaignId: number | null;
}

/** How the principal is named in the audit log and in messages. */
export function principalLabel(principal: Principal): string {
  return principal.kind === 'user' ? principal.email : `token ${principal.tokenId}`;
}
