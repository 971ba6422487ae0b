/**
 * When to try a failed webhook delivery again: exponential backoff,
 * FIRST_RETRY_S · 2^(attempts − 1), capped at MAX_RETRY_S (common practice,
 * no source). Never given up: a receiver that is down for a day gets every
 * flag once it is back, at most an hour later. No jitter: deliveries are
 * spread over webhooks and flags already, and a fixed schedule is easier to
 * reason about in tests and logs.
 */
export const FIRST_RETRY_S = 30;
export const MAX_RETRY_S = 3600;

/** Seconds to wait after the `attempts`-th failed attempt (attempts ≥ 1). */
export function retryDelaySeconds(attempts: number): number {
  const n = Math.max(1, Math.floor(attempts));
  return Math.min(MAX_RETRY_S, FIRST_RETRY_S * 2 ** Math.min(n - 1, 30));
}
