import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import { once } from 'node:events';
import { copyFileSync, existsSync, mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import mqtt, { type IClientOptions, type MqttClient } from 'mqtt';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { IngestWorker } from '../ingest/worker';
import { verifyMosquittoPassword } from '../lib/broker/passwordHash';
import { anyFreePort } from '../lib/net/freePort';
import { signedInWorker, stationRecord, storedMinutes } from './brokerHelpers';
import { createMigratedDatabase, type TestDatabase } from './helpers/db';
import { registerFleet, smallFleet, uniqueSuffix } from './helpers/fleet';
import { waitFor } from './helpers/waitFor';

/**
 * Issue 8, "must show 2", with Mosquitto: the files `holdfast broker export`
 * writes configure a real Mosquitto (our own process, on a free port), and a
 * vessel's credentials publishing on another vessel's topic are refused and
 * nothing is stored. Skipped only when the mosquitto binary is missing.
 */
const MOSQUITTO = '/usr/sbin/mosquitto';
const MOSQUITTO_PASSWD = ['/usr/bin/mosquitto_passwd', '/usr/sbin/mosquitto_passwd'].find((p) => existsSync(p));

describe.skipIf(!existsSync(MOSQUITTO))('Mosquitto configured by holdfast broker export', () => {
  const s = uniqueSuffix();
  const root = `mq-${s}/v1`;
  const keyA = `gull-a-${s}`;
  const keyB = `gull-b-${s}`;
  const dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-mosquitto-'));
  const exportDir = path.join(dir, 'export');
  let db: TestDatabase;
  let broker: ChildProcess | undefined;
  let brokerLog = '';
  let url: string;
  let worker: IngestWorker;
  const creds: Record<string, { username: string; password: string }> = {};
  const clients: MqttClient[] = [];

  const holdfast = (args: string[]) => {
    const result = spawnSync(process.execPath, ['bin/holdfast.mjs', ...args], {
      env: { ...process.env, DATABASE_URL: db.url, MQTT_TOPIC_ROOT: root, LOG_LEVEL: 'warn' },
      encoding: 'utf8',
    });
    if (result.status !== 0) throw new Error(`holdfast ${args.join(' ')}: ${result.stderr}`);
    return result.stdout;
  };
  const credentialsIn = (stdout: string) => ({
    username: /^username: (\S+)$/m.exec(stdout)![1]!,
    password: /^password: (\S+)$/m.exec(stdout)![1]!,
  });
  const connect = async (options: IClientOptions) => {
    const client = await mqtt.connectAsync(url, { reconnectPeriod: 0, connectTimeout: 5_000, ...options });
    clients.push(client);
    return client;
  };
  const station = (minute: number) => stationRecord(minute, 6);
  const stored = (key: string) => storedMinutes(db, key);

  beforeAll(async () => {
    db = await createMigratedDatabase();
    await registerFleet(db.url, smallFleet(keyA));
    await registerFleet(db.url, smallFleet(keyB));
    creds.a = credentialsIn(holdfast(['vessel', 'credentials', keyA]));
    creds.b = credentialsIn(holdfast(['vessel', 'credentials', keyB]));
    creds.ingest = credentialsIn(holdfast(['broker', 'export', '--out', exportDir]));

    const port = await anyFreePort();
    url = `mqtt://127.0.0.1:${port}`;
    const conf = path.join(dir, 'mosquitto.conf');
    writeFileSync(
      conf,
      [
        `listener ${port} 127.0.0.1`,
        'persistence false',
        // stderr is not buffered in a pipe; "all" includes the debug lines that name denied publishes.
        'log_dest stderr',
        'log_type all',
        // Started as root, Mosquitto would switch to the "mosquitto" user, which cannot read a 0600 file of root's.
        ...(process.getuid?.() === 0 ? ['user root'] : []),
        `include_dir ${exportDir}`,
        '',
      ].join('\n'),
    );
    broker = spawn(MOSQUITTO, ['-c', conf], { stdio: ['ignore', 'pipe', 'pipe'] });
    broker.stdout!.on('data', (d) => (brokerLog += d));
    broker.stderr!.on('data', (d) => (brokerLog += d));
    await waitFor(() => brokerLog.includes('running') || broker!.exitCode !== null, 10_000, 'mosquitto to start');
    if (broker.exitCode !== null) throw new Error(`mosquitto did not start:\n${brokerLog}`);

    worker = await signedInWorker(db, { mqttUrl: url, username: creds.ingest.username, password: creds.ingest.password, clientId: `worker-${s}`, topicRoot: root });
  }, 120_000);
  afterAll(async () => {
    await Promise.all(clients.map((c) => c.endAsync(true).catch(() => {})));
    await worker?.stop();
    if (broker && broker.exitCode === null) {
      broker.kill('SIGTERM');
      await once(broker, 'exit');
    }
    await db?.drop();
    rmSync(dir, { recursive: true, force: true });
  });

  it('writes a password file of hashes only (0600), an ACL file and a config snippet', () => {
    expect(readdirSync(exportDir).sort()).toEqual(['acl', 'holdfast.conf', 'passwd']);
    const passwd = readFileSync(path.join(exportDir, 'passwd'), 'utf8');
    expect(passwd.trim().split('\n').map((l) => l.split(':')[0])).toEqual(['gull-a-' + s, 'gull-b-' + s, 'holdfast_ingest'].sort());
    for (const line of passwd.trim().split('\n')) expect(line).toMatch(/^[a-z0-9_-]+:\$7\$101\$[A-Za-z0-9+/]{16}\$[A-Za-z0-9+/]{86}==$/);
    for (const file of ['acl', 'holdfast.conf', 'passwd']) {
      const text = readFileSync(path.join(exportDir, file), 'utf8');
      for (const c of Object.values(creds)) expect(text).not.toContain(c.password);
    }
    expect(statSync(path.join(exportDir, 'passwd')).mode & 0o777).toBe(0o600);
    expect(readFileSync(path.join(exportDir, 'acl'), 'utf8')).toContain(`user ${keyA}\ntopic write ${root}/${keyA}/+\n`);
  });

  it.skipIf(!MOSQUITTO_PASSWD)("is a password file mosquitto_passwd itself reads and extends", async () => {
    const copy = path.join(dir, 'passwd-copy');
    copyFileSync(path.join(exportDir, 'passwd'), copy);
    const added = spawnSync(MOSQUITTO_PASSWD!, ['-b', copy, 'extra_user', 'extra password'], { encoding: 'utf8' });
    expect(added.status, added.stderr).toBe(0);
    const lines = readFileSync(copy, 'utf8').trim().split('\n');
    // Our lines survive its rewrite untouched, and its own line verifies with our code.
    for (const line of readFileSync(path.join(exportDir, 'passwd'), 'utf8').trim().split('\n')) expect(lines).toContain(line);
    const extra = lines.find((l) => l.startsWith('extra_user:'))!.slice('extra_user:'.length);
    expect(await verifyMosquittoPassword('extra password', extra)).toBe(true);
  });

  it('refuses clients without credentials or with wrong ones', async () => {
    await expect(connect({ clientId: `anon-${s}`, protocolVersion: 4 })).rejects.toThrow(/Not authorized/);
    await expect(connect({ clientId: `bad-${s}`, protocolVersion: 4, username: creds.a!.username, password: creds.b!.password })).rejects.toThrow(/Not authorized|Bad user/);
  });

  it("stores a vessel's own records and refuses, then drops, its records on another vessel's topic", async () => {
    const a5 = await connect({ clientId: `a5-${s}`, protocolVersion: 5, username: creds.a!.username, password: creds.a!.password });
    await a5.publishAsync(`${root}/${keyA}/station`, station(1), { qos: 1 });
    await waitFor(async () => (await stored(keyA)).length === 1, 15_000, "A's own record");

    // MQTT 5: Mosquitto answers the forgery with PUBACK reason code 0x87, "Not authorized" (MQTT 5, 3.4.2.1).
    const refused = await a5.publishAsync(`${root}/${keyB}/station`, station(2), { qos: 1 }).then(
      () => null,
      (e: Error & { code?: number }) => e,
    );
    expect(refused?.code).toBe(135);
    // MQTT 3.1.1 has no way to say no: Mosquitto acknowledges and drops it.
    const a4 = await connect({ clientId: `a4-${s}`, protocolVersion: 4, username: creds.a!.username, password: creds.a!.password });
    await a4.publishAsync(`${root}/${keyB}/station`, station(3), { qos: 1 });
    expect(brokerLog).toMatch(new RegExp(`Denied PUBLISH from a4-${s}`));

    // A listens on the whole root: Mosquitto grants the SUBACK but delivers nothing the ACL does not allow.
    const heard: string[] = [];
    a5.on('message', (topic) => heard.push(topic));
    await a5.subscribeAsync(`${root}/#`, { qos: 1 });

    const b = await connect({ clientId: `b-${s}`, protocolVersion: 5, username: creds.b!.username, password: creds.b!.password });
    await b.publishAsync(`${root}/${keyB}/station`, station(4), { qos: 1 });
    await waitFor(async () => (await stored(keyB)).length === 1, 15_000, "B's own record");
    await new Promise((r) => setTimeout(r, 500));
    expect(await stored(keyB)).toEqual([4]);
    expect(await stored(keyA)).toEqual([1]);
    expect((await db.pool.query('SELECT count(*)::int AS n FROM quarantine')).rows[0].n).toBe(0);
    expect(worker.handler.counters.messages).toBe(2);
    expect(heard).toEqual([]);
  });

  it('lets the ingest credentials read but not publish', async () => {
    const w = await connect({ clientId: `w2-${s}`, protocolVersion: 5, username: creds.ingest!.username, password: creds.ingest!.password });
    const refused = await w.publishAsync(`${root}/${keyA}/station`, station(5), { qos: 1 }).then(
      () => null,
      (e: Error & { code?: number }) => e,
    );
    expect(refused?.code).toBe(135);
    await new Promise((r) => setTimeout(r, 300));
    expect(await stored(keyA)).toEqual([1]);
  });
});
