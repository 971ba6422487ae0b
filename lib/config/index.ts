import { envSchema, type Env } from './env';

export type Config = Env;

/** A bad setting: the message is one line naming the setting and the fault. */
export class ConfigError extends Error {
  constructor(
    readonly setting: string,
    detail: string,
  ) {
    super(`Setting ${setting}: ${detail}`);
    this.name = 'ConfigError';
  }
}

/**
 * Parse the environment once. Empty strings count as unset, so
 * `DATABASE_URL= npm start` means "use the embedded database".
 */
export function loadConfig(env: Record<string, string | undefined> = process.env): Config {
  const set = Object.fromEntries(Object.entries(env).filter(([, v]) => v !== undefined && v.trim() !== ''));
  const result = envSchema.safeParse(set);
  if (result.success) return result.data;
  const issue = result.error.issues[0]!;
  const setting = String(issue.path[0] ?? 'environment');
  const raw = env[setting];
  const got = raw === undefined ? '' : ` (got ${JSON.stringify(raw.length > 60 ? raw.slice(0, 60) + '…' : raw)})`;
  throw new ConfigError(setting, issue.message + got);
}
