import { describe, expect, it } from 'vitest';
import type { Logger } from '../lib/log/logger';
import { classifyBrokerError, classifyDatabaseError, retryAtStart, StartupRefused } from './startupRetry';

/** A logger that keeps its warnings and infos. */
function recordingLogger() {
  const lines: string[] = [];
  const log: Logger = {
    debug: () => {},
    info: (m) => lines.push(`info ${m}`),
    warn: (m) => lines.push(`warn ${m}`),
    error: (m) => lines.push(`error ${m}`),
    child: () => log,
  };
  return { log, lines };
}

const withCode = (code: string | number, message = 'x') => Object.assign(new Error(message), { code });

describe('start-up retries', () => {
  it('retries an unreachable service with doubling waits, then returns its result', async () => {
    const { log, lines } = recordingLogger();
    let calls = 0;
    const started = performance.now();
    const result = await retryAtStart(
      async () => {
        calls++;
        if (calls < 4) throw withCode('ECONNREFUSED', 'connect ECONNREFUSED 127.0.0.1:1');
        return 'up';
      },
      { what: 'database', setting: 'DATABASE_URL', classify: classifyDatabaseError, log, minMs: 20 },
    );
    expect(result).toBe('up');
    expect(calls).toBe(4);
    const waits = lines.filter((l) => l.startsWith('warn')).map((l) => Number(/retrying in ([\d.]+) s/.exec(l)![1]) * 1000);
    expect(lines[0]).toMatch(/^warn database unreachable at start \(connect ECONNREFUSED 127\.0\.0\.1:1\); retrying in 0\.0 s$/);
    expect(waits).toHaveLength(3);
    expect(lines.at(-1)).toBe('info database reachable after 4 attempts; starting');
    // 20 + 40 + 80 ms, each ±20 %: at least 112 ms in all.
    expect(performance.now() - started).toBeGreaterThanOrEqual(112);
  });

  it('turns refused credentials into one StartupRefused naming the setting, without retrying', async () => {
    const { log, lines } = recordingLogger();
    let calls = 0;
    const attempt = retryAtStart(
      async () => {
        calls++;
        throw withCode('28P01', 'password authentication failed for user "ingest"');
      },
      { what: 'database', setting: 'DATABASE_URL', classify: classifyDatabaseError, log, minMs: 1 },
    );
    await expect(attempt).rejects.toThrow(StartupRefused);
    await expect(attempt).rejects.toThrow(
      'Setting DATABASE_URL: the database refused the connection (password authentication failed for user "ingest"); check the setting, not retrying',
    );
    expect(calls).toBe(1);
    expect(lines).toEqual([]);
  });

  it('throws any other error as it is', async () => {
    const { log } = recordingLogger();
    const checksum = new Error('migration 0003 changed after it was applied');
    await expect(retryAtStart(async () => Promise.reject(checksum), { what: 'database', setting: 'DATABASE_URL', classify: classifyDatabaseError, log })).rejects.toBe(checksum);
  });

  it('gives up after `attempts` when asked to', async () => {
    const { log } = recordingLogger();
    const down = withCode('ECONNREFUSED');
    await expect(retryAtStart(async () => Promise.reject(down), { what: 'broker', setting: 'MQTT_URL', classify: classifyBrokerError, log, minMs: 1, attempts: 3 })).rejects.toBe(down);
  });

  // Source: PostgreSQL 15 documentation, Appendix A "PostgreSQL Error Codes".
  it.for([
    ['28P01', 'refused'], // invalid_password
    ['28000', 'refused'], // invalid_authorization_specification (no such role)
    ['3D000', 'refused'], // invalid_catalog_name (no such database)
    ['57P03', 'unreachable'], // cannot_connect_now (starting up)
    ['57P01', 'unreachable'], // admin_shutdown
    ['53300', 'unreachable'], // too_many_connections
    ['08006', 'unreachable'], // connection_failure
    ['ECONNREFUSED', 'unreachable'],
    ['ENOTFOUND', 'unreachable'],
    ['42P01', 'other'], // undefined_table: a bug, not a fault of the surroundings
  ] as const)('database error %s is %s', ([code, fault]) => {
    expect(classifyDatabaseError(withCode(code))).toBe(fault);
  });

  // Source: MQTT 3.1.1 §3.2.2.3 (CONNACK return codes), MQTT 5.0 §3.2.2.2 (CONNACK reason codes).
  it.for([
    [4, 'refused'], // 3.1.1 bad user name or password
    [5, 'refused'], // 3.1.1 not authorized
    [0x86, 'refused'], // 5.0 bad user name or password
    [0x87, 'refused'], // 5.0 not authorized
    [3, 'unreachable'], // 3.1.1 server unavailable
    [0x88, 'unreachable'], // 5.0 server unavailable
    [0x89, 'unreachable'], // 5.0 server busy
    ['ECONNREFUSED', 'unreachable'],
    [2, 'other'], // identifier rejected: our client id, not the surroundings
  ] as const)('broker error %s is %s', ([code, fault]) => {
    expect(classifyBrokerError(withCode(code))).toBe(fault);
  });

  it('takes a connack timeout and a connection closed before CONNACK as unreachable', () => {
    expect(classifyBrokerError(new Error('connack timeout'))).toBe('unreachable');
    expect(classifyBrokerError(new Error('connection closed before the broker answered'))).toBe('unreachable');
  });
});
