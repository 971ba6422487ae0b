import { spawn, type ChildProcess } from 'node:child_process';
import net from 'node:net';
import { Aedes } from 'aedes';
import { afterAll, beforeAll, describe, expect, inject, it } from 'vitest';
import { anyFreePort } from '../lib/net/freePort';
import { createTestDatabase, type TestDatabase } from './helpers/db';
import { uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';
import { openRelay, type TcpRelay } from './faults/tcpProxy';

/**
 * `holdfast ingest` started before its database or broker: it says so and
 * retries with growing waits, then starts once the service answers; it does
 * not crash (a supervisor would restart it in a loop). Wrong credentials end
 * it at once with one clear line and no stack. The services are made
 * unreachable by pointing the worker at a port that is opened only later,
 * relaying to the test's real PostgreSQL and broker.
 */
describe('ingest start-up faults', () => {
  const suffix = uniqueSuffix();
  let db: TestDatabase;
  const children: ChildProcess[] = [];
  const relays: TcpRelay[] = [];

  beforeAll(async () => {
    db = await createTestDatabase();
  });
  afterAll(async () => {
    for (const c of children) if (c.exitCode === null && c.signalCode === null) c.kill('SIGKILL');
    for (const r of relays) await r.close();
    await db?.drop();
  });

  const withPort = (url: string, port: number) => {
    const u = new URL(url);
    u.hostname = '127.0.0.1';
    u.port = String(port);
    return u.toString();
  };
  const target = (url: string) => ({ host: new URL(url).hostname, port: Number(new URL(url).port) });

  function startWorker(env: Record<string, string>) {
    const child = spawn(process.execPath, ['bin/holdfast.mjs', 'ingest'], {
      env: {
        ...process.env,
        DATABASE_URL: db.url,
        MQTT_URL: inject('mqttUrl'),
        MQTT_TOPIC_ROOT: `startup-${suffix}/v1`,
        MQTT_CLIENT_ID: `holdfast-startup-${suffix}-${children.length}`,
        HOLDFAST_METRICS_PORT: '0',
        LOG_LEVEL: 'info',
        LOG_FORMAT: 'text',
        ...env,
      },
      stdio: ['ignore', 'pipe', 'pipe'],
    });
    children.push(child);
    const out = { text: '', exit: undefined as number | null | undefined };
    child.stdout!.on('data', (d: Buffer) => (out.text += d.toString()));
    child.stderr!.on('data', (d: Buffer) => (out.text += d.toString()));
    child.once('exit', (code) => (out.exit = code));
    return { child, out };
  }

  const stop = async (child: ChildProcess) => {
    const exited = new Promise<number | null>((r) => child.once('exit', (code) => r(code)));
    child.kill('SIGTERM');
    return exited;
  };

  /** The waits the worker announced, seconds, in order. */
  const waits = (text: string, what: string) =>
    [...text.matchAll(new RegExp(`${what} unreachable at start \\(.*\\); retrying in ([\\d.]+) s`, 'g'))].map((m) => Number(m[1]));

  it.for([
    { what: 'database', setting: 'DATABASE_URL', real: () => db.url },
    { what: 'broker', setting: 'MQTT_URL', real: () => inject('mqttUrl') },
  ])('waits for the $what with growing waits, then starts', { timeout: 60_000 }, async ({ what, setting, real }) => {
    const port = await anyFreePort();
    const { child, out } = startWorker({ [setting]: withPort(real(), port) });
    await waitFor(() => waits(out.text, what).length >= 3 || out.exit !== undefined, 20_000, `three retries logged for the ${what}`);
    expect(out.exit, out.text).toBeUndefined();
    const seen = waits(out.text, what);
    // Doubling waits with ±20 % jitter from 0.5 s: each clearly longer than the one before.
    for (let i = 1; i < seen.length; i++) expect(seen[i]!).toBeGreaterThan(seen[i - 1]!);
    expect(seen[0]!).toBeGreaterThanOrEqual(0.4);
    expect(seen[0]!).toBeLessThanOrEqual(0.6);
    expect(out.text).not.toMatch(/\n\s+at /); // no stack trace: a warning per attempt, nothing more

    relays.push(await openRelay(port, target(real())));
    // Signalled only once it says a signal stops it cleanly (cli/commands/services.ts untilSignal).
    await waitFor(() => out.text.includes('SIGTERM stops it cleanly') || out.exit !== undefined, 30_000, 'the worker to start');
    expect(out.text).toMatch(new RegExp(`${what} reachable after \\d+ attempts; starting`));
    expect(out.text).toContain('subscribed to');
    expect(await stop(child)).toBe(0);
  });

  it('ends with one clear line when the database refuses the credentials', async () => {
    const u = new URL(db.url);
    u.username = `nobody_${suffix}`;
    u.password = 'wrong';
    const { out } = startWorker({ DATABASE_URL: u.toString() });
    await waitFor(() => out.exit !== undefined, 20_000, 'the worker to exit');
    expect(out.exit).toBe(1);
    const lines = out.text.trim().split('\n');
    expect(lines, out.text).toHaveLength(1);
    expect(lines[0]).toMatch(/^Setting DATABASE_URL: the database refused the connection \(.*nobody_.*\); check the setting, not retrying$/);
  });

  it('ends with one clear line when the broker refuses the credentials', async () => {
    // A broker of this test's own that refuses everyone: the shared one may allow anonymous clients.
    const broker = await Aedes.createBroker({ authenticate: (_client, _user, _password, done) => done(Object.assign(new Error('no'), { returnCode: 4 }), false) });
    const server = net.createServer(broker.handle);
    await new Promise<void>((r) => server.listen(0, '127.0.0.1', r));
    try {
      const port = (server.address() as net.AddressInfo).port;
      const { out } = startWorker({ MQTT_URL: `mqtt://127.0.0.1:${port}`, MQTT_USERNAME: 'ingest', MQTT_PASSWORD: 'wrong' });
      await waitFor(() => out.exit !== undefined, 30_000, 'the worker to exit');
      expect(out.exit).toBe(1);
      const problems = out.text.split('\n').filter((l) => !/\binfo\b/.test(l) && l.trim() !== '');
      expect(problems, out.text).toEqual([
        'Setting MQTT_USERNAME/MQTT_PASSWORD: the broker refused the connection (Connection refused: Bad username or password); check the setting, not retrying',
      ]);
    } finally {
      await new Promise<void>((r) => broker.close(() => server.close(() => r())));
    }
  });
});
