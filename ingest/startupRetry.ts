import type { Logger } from '../lib/log/logger';

/**
 * Start-up against a database or broker that is not there yet. A worker
 * started before its services (a host booting, a container order, a service
 * restarting) should wait for them, saying so, rather than crash and be
 * restarted in a loop by its supervisor. Wrong settings are the opposite:
 * no retry can cure them, so they end start-up with one clear line.
 */
export type StartupFault = 'unreachable' | 'refused' | 'other';

export interface StartupRetryOptions {
  /** What is being reached, for the log: "database", "broker". */
  what: string;
  /** The setting that names it, for the one-line error: "DATABASE_URL". */
  setting: string;
  classify(error: unknown): StartupFault;
  log: Logger;
  /** First wait, ms (default 500); it doubles up to `maxMs` (default 30,000). */
  minMs?: number;
  maxMs?: number;
  /** Give up after this many attempts (default: never). */
  attempts?: number;
}

/** An error that ends start-up on purpose; its message is the whole story (the CLI prints it without a stack). */
export class StartupRefused extends Error {}

const message = (error: unknown) => (error instanceof Error ? error.message || (error as NodeJS.ErrnoException).code || error.name : String(error));

/**
 * Run `attempt` until it succeeds. An unreachable service is retried with
 * doubling waits (±20 % jitter, so workers restarted together do not knock
 * together: common practice, no source), one warning per attempt; a refusal
 * (credentials, a missing database) throws StartupRefused; anything else is
 * thrown as it is.
 */
export async function retryAtStart<T>(attempt: () => Promise<T>, options: StartupRetryOptions): Promise<T> {
  const { what, setting, classify, log, minMs = 500, maxMs = 30_000, attempts = Infinity } = options;
  let wait = minMs;
  for (let n = 1; ; n++) {
    try {
      const result = await attempt();
      if (n > 1) log.info(`${what} reachable after ${n} attempts; starting`);
      return result;
    } catch (error) {
      const fault = classify(error);
      if (fault === 'refused') {
        throw new StartupRefused(`Setting ${setting}: the ${what} refused the connection (${message(error)}); check the setting, not retrying`);
      }
      if (fault === 'other' || n >= attempts) throw error;
      const delay = Math.round(wait * (0.8 + Math.random() * 0.4));
      log.warn(`${what} unreachable at start (${message(error)}); retrying in ${(delay / 1000).toFixed(1)} s`, { attempt: n });
      await new Promise((resolve) => setTimeout(resolve, delay));
      wait = Math.min(wait * 2, maxMs);
    }
  }
}

/** Network errors that mean "not there (yet)": nothing listening, no route, no name, reset, timeout. */
const NETWORK_CODES = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EHOSTUNREACH', 'ENETUNREACH', 'EHOSTDOWN', 'ENOTFOUND', 'EAI_AGAIN', 'EPIPE']);

/**
 * PostgreSQL: class 28 (invalid authorization) and 3D000 (no such database)
 * are settings to fix. Class 08 (connection exception), 57P01–57P03 (shut
 * down, crashed, starting up) and 53300 (too many connections) pass.
 * Source: PostgreSQL 15 documentation, Appendix A "PostgreSQL Error Codes".
 */
export function classifyDatabaseError(error: unknown): StartupFault {
  const code = String((error as { code?: unknown }).code ?? '');
  if (/^28/.test(code) || code === '3D000') return 'refused';
  if (NETWORK_CODES.has(code) || /^08/.test(code) || /^57P0[123]$/.test(code) || code === '53300') return 'unreachable';
  // pg's own words for a socket that closed or never answered.
  if (/Connection terminated|timeout expired|connect ETIMEDOUT/i.test(message(error))) return 'unreachable';
  return 'other';
}

/**
 * MQTT CONNACK refusals: bad user name or password and not authorized
 * (3.1.1 return codes 4 and 5; MQTT 5 reason codes 0x86, 0x87, 0x8A banned,
 * 0x8C bad authentication method) are settings to fix; "server unavailable"
 * (3; 0x88) and "server busy" (0x89) pass, as do network errors.
 * Source: MQTT 3.1.1 §3.2.2.3, MQTT 5.0 §3.2.2.2.
 */
export function classifyBrokerError(error: unknown): StartupFault {
  const code = (error as { code?: unknown }).code;
  if (typeof code === 'number') {
    if ([4, 5, 0x86, 0x87, 0x8a, 0x8c].includes(code)) return 'refused';
    if ([3, 0x88, 0x89].includes(code)) return 'unreachable';
    return 'other';
  }
  if (typeof code === 'string' && NETWORK_CODES.has(code)) return 'unreachable';
  if (/connack timeout|closed before the broker answered/i.test(message(error))) return 'unreachable';
  return 'other';
}
