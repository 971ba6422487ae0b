import { describe, expect, it } from 'vitest';
import { createLogger, resolveLogFormat, textLine, type LogFormat, type LogLevel } from './logger';

function capture(format: LogFormat, level: LogLevel = 'info') {
  const lines: string[] = [];
  const log = createLogger(level, 'holdfast', (line) => lines.push(line), format);
  return { log, lines };
}

describe('logger, json format', () => {
  it('writes one JSON object per line with level, time, component name and message', () => {
    const { log, lines } = capture('json');
    log.info('Holdfast is running: http://localhost:3000');
    log.child('ingest').warn('subscribed to fleet/v1/+/+ (MQTT 5)');
    expect(lines).toHaveLength(2);
    const [first, second] = lines.map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(first).toMatchObject({ level: 'info', name: 'holdfast', msg: 'Holdfast is running: http://localhost:3000' });
    expect(new Date(first!.time as string).toISOString()).toBe(first!.time); // ISO 8601, UTC
    expect(typeof first!.pid).toBe('number');
    expect(second).toMatchObject({ level: 'warn', name: 'ingest', msg: 'subscribed to fleet/v1/+/+ (MQTT 5)' });
    // One name per line: a child replaces the component instead of adding a second key.
    expect(lines[1]!.match(/"name":/g)).toHaveLength(1);
  });

  it('puts structured fields on the line as keys', () => {
    const { log, lines } = capture('json');
    log.child('ingest').info('ingest totals', { messages: 12, stored: 40, broker_connected: true });
    expect(JSON.parse(lines[0]!)).toMatchObject({ name: 'ingest', msg: 'ingest totals', messages: 12, stored: 40, broker_connected: true });
  });

  it('keeps printf-like characters in messages as they are', () => {
    const { log, lines } = capture('json');
    log.info('50% done, %s %d');
    expect(JSON.parse(lines[0]!).msg).toBe('50% done, %s %d');
  });
});

describe('logger, text format', () => {
  it('writes the compact line HH:MM:SS.mmm level [component] message', () => {
    const { log, lines } = capture('text');
    log.info('stopped');
    log.child('store').error('migration failed');
    expect(lines[0]).toMatch(/^\d\d:\d\d:\d\d\.\d{3} info  \[holdfast\] stopped$/);
    expect(lines[1]).toMatch(/^\d\d:\d\d:\d\d\.\d{3} error \[store\] migration failed$/);
  });

  it('shows structured fields as key=value after the message, quoting only where needed', () => {
    const { log, lines } = capture('text');
    log.info('ingest totals', { messages: 3, stored: 10, note: 'two words', ok: true });
    expect(lines[0]).toMatch(/\[holdfast\] ingest totals messages=3 stored=10 note="two words" ok=true$/);
  });

  it('shows the time of the event in UTC', () => {
    const line = textLine(JSON.stringify({ level: 'warn', time: '2026-12-01T23:05:07.042Z', name: 'ingest', msg: 'still disconnected' }));
    expect(line).toBe('23:05:07.042 warn  [ingest] still disconnected');
  });
});

describe('logger levels and format choice', () => {
  it.each([
    ['debug', ['debug', 'info', 'warn', 'error']],
    ['info', ['info', 'warn', 'error']],
    ['warn', ['warn', 'error']],
    ['error', ['error']],
  ] as const)('at %s writes only %o', (level, expected) => {
    const { log, lines } = capture('json', level);
    const child = log.child('jobs'); // children keep the level
    child.debug('d');
    child.info('i');
    child.warn('w');
    child.error('e');
    expect(lines.map((l) => JSON.parse(l).level)).toEqual(expected);
  });

  it('auto is text on a terminal and json otherwise', () => {
    expect(resolveLogFormat('auto', true)).toBe('text');
    expect(resolveLogFormat('auto', false)).toBe('json');
    expect(resolveLogFormat('json', true)).toBe('json');
    expect(resolveLogFormat('text', false)).toBe('text');
  });
});
