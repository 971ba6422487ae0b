/**
 * The four roles of issue 8, from the most limited to the most trusted.
 * The same list is in the CHECKs of app_user and api_token (0001, 0008);
 * lib/api/tokens.ts keeps its own copy until the API is wired to lib/auth.
 */
export const ROLES = ['charterer', 'shore_engineer', 'fleet_manager', 'admin'] as const;
export type Role = (typeof ROLES)[number];

export function isRole(value: unknown): value is Role {
  return typeof value === 'string' && (ROLES as readonly string[]).includes(value);
}
