import type { Scope } from '../auth/scope';

/**
 * The scope rule (lib/auth/scope.ts) as bound SQL parameters, for queries
 * that must filter before a LIMIT or a count: three parallel arrays (vessel
 * key, first day, last day) of the visible windows, or three nulls for the
 * whole fleet. SCOPE_SPAN_SQL is canSeeSpan over them; the windows are
 * merged already, so "inside one window" is "every day visible".
 */
export type ScopeParams = [string[] | null, string[] | null, string[] | null];

export function scopeParams(scope: Scope): ScopeParams {
  if (scope.kind === 'fleet') return [null, null, null];
  const keys: string[] = [];
  const froms: string[] = [];
  const tos: string[] = [];
  for (const [key, windows] of scope.windows) {
    for (const w of windows) keys.push(key), froms.push(w.from), tos.push(w.to);
  }
  return [keys, froms, tos];
}

/** `$n`, `$n+1`, `$n+2` are the ScopeParams; `keyCol`, `fromCol`, `toCol` are fixed column expressions of the caller. */
export function scopeSpanSql(n: number, keyCol: string, fromCol: string, toCol: string): string {
  return `($${n}::text[] IS NULL OR EXISTS (
            SELECT 1 FROM unnest($${n}::text[], $${n + 1}::date[], $${n + 2}::date[]) AS w(k, d_from, d_to)
             WHERE w.k = ${keyCol} AND w.d_from <= ${fromCol} AND ${toCol} <= w.d_to))`;
}
