import { pino, stdTimeFunctions, type DestinationStream } from 'pino';

export type LogLevel = 'debug' | 'info' | 'warn' | 'error';
/** `auto`: `text` when stderr is a terminal, `json` otherwise (a log collector reads it). */
export type LogFormat = 'auto' | 'json' | 'text';
/** Structured fields of an event: in JSON they are keys of the line, in text ` key=value` after the message. */
export type LogFields = Record<string, string | number | boolean | null | undefined>;

export interface Logger {
  debug(message: string, fields?: LogFields): void;
  info(message: string, fields?: LogFields): void;
  warn(message: string, fields?: LogFields): void;
  error(message: string, fields?: LogFields): void;
  /** The same logger under another component name (`[name]` in text, `name` in JSON). */
  child(name: string): Logger;
}

export function resolveLogFormat(format: LogFormat, stderrIsTty = Boolean(process.stderr.isTTY)): 'json' | 'text' {
  if (format !== 'auto') return format;
  return stderrIsTty ? 'text' : 'json';
}

/** Keys pino writes itself; everything else on a line is a field of the event. */
const OWN_KEYS = new Set(['level', 'time', 'pid', 'hostname', 'name', 'msg']);

const fieldText = (value: unknown) => (typeof value === 'string' && !/[\s"=]/.test(value) && value !== '' ? value : JSON.stringify(value));

/** A pino JSON line → `HH:MM:SS.mmm level [component] message key=value…` (UTC, as before pino). */
export function textLine(json: string): string {
  const event = JSON.parse(json) as Record<string, unknown>;
  const fields = Object.entries(event)
    .filter(([key]) => !OWN_KEYS.has(key))
    .map(([key, value]) => ` ${key}=${fieldText(value)}`)
    .join('');
  const time = String(event.time).slice(11, 23);
  return `${time} ${String(event.level).padEnd(5)} [${String(event.name)}] ${String(event.msg)}${fields}`;
}

/**
 * The logger every part of Holdfast writes through: pino, one line per
 * event, to stderr (or to `write`, one line at a time without the newline).
 * In `json` a line carries `level` (a name), `time` (ISO 8601), `pid`,
 * `hostname`, `name` (the component) and `msg`, plus the event's fields; in
 * `text` it is the compact line `HH:MM:SS.mmm level [component] message`.
 */
export function createLogger(
  level: LogLevel = 'info',
  name = 'holdfast',
  write: (line: string) => void = (line) => process.stderr.write(line + '\n'),
  format: LogFormat = 'auto',
): Logger {
  const text = resolveLogFormat(format) === 'text';
  // pino hands the destination whole lines, newline included.
  const destination: DestinationStream = {
    write: (line) => {
      const bare = line.endsWith('\n') ? line.slice(0, -1) : line;
      write(text ? textLine(bare) : bare);
    },
  };
  const root = pino(
    {
      level,
      timestamp: stdTimeFunctions.isoTime,
      formatters: { level: (label) => ({ level: label }) },
    },
    destination,
  );
  // Children replace the component name instead of nesting it, so a line has one `name`.
  const named = (component: string): Logger => {
    const p = root.child({ name: component });
    const at =
      (method: 'debug' | 'info' | 'warn' | 'error') =>
      (message: string, fields?: LogFields): void =>
        fields ? p[method](fields, message) : p[method](message);
    return { debug: at('debug'), info: at('info'), warn: at('warn'), error: at('error'), child: named };
  };
  return named(name);
}

export const silentLogger: Logger = {
  debug() {},
  info() {},
  warn() {},
  error() {},
  child: () => silentLogger,
};
