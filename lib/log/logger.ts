export type LogLevel = 'debug' | 'info' | 'warn' | 'error';
const ORDER: Record<LogLevel, number> = { debug: 10, info: 20, warn: 30, error: 40 };

export interface Logger {
  debug(message: string): void;
  info(message: string): void;
  warn(message: string): void;
  error(message: string): void;
  child(name: string): Logger;
}

/** One line per event: `HH:MM:SS.mmm level [component] message`, to stderr. */
export function createLogger(level: LogLevel = 'info', name = 'holdfast', write = (line: string) => process.stderr.write(line + '\n')): Logger {
  const emit = (at: LogLevel, message: string) => {
    if (ORDER[at] < ORDER[level]) return;
    write(`${new Date().toISOString().slice(11, 23)} ${at.padEnd(5)} [${name}] ${message}`);
  };
  return {
    debug: (m) => emit('debug', m),
    info: (m) => emit('info', m),
    warn: (m) => emit('warn', m),
    error: (m) => emit('error', m),
    child: (child) => createLogger(level, child, write),
  };
}

export const silentLogger: Logger = {
  debug() {},
  info() {},
  warn() {},
  error() {},
  child: () => silentLogger,
};
