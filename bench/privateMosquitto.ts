import { spawn } from 'node:child_process';
import { existsSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { anyFreePort } from '../lib/net/freePort';
import { reachable } from './benchEnv';

/** Where Debian puts the broker; undefined when it is not installed. */
export const MOSQUITTO_BINARY = ['/usr/sbin/mosquitto', '/usr/bin/mosquitto'].find((p) => existsSync(p));

export interface PrivateBroker {
  url: string;
  pid: number;
  close(): Promise<void>;
}

/**
 * The configuration of a Mosquitto of our own, as docs/telemetry.md "Broker
 * settings" advises for ingest: a deep per-client queue and many messages in
 * flight, so a flood never makes the broker drop QoS 1 messages. With
 * `persistenceDir` it keeps sessions and queued messages over a restart (the
 * fault suite); started as root it stays root, or it could not write there.
 * Shared subscriptions ($share/GROUP/…) need no setting: MQTT 5 brokers have
 * them on.
 */
export function mosquittoConf(options: { port: number; persistenceDir?: string; maxQueued?: number }): string {
  const { port, persistenceDir, maxQueued = 1_000_000 } = options;
  return [
    `listener ${port} 127.0.0.1`,
    'allow_anonymous true',
    ...(persistenceDir ? ['persistence true', `persistence_location ${persistenceDir}/`] : ['persistence false']),
    `max_queued_messages ${maxQueued}`,
    'max_inflight_messages 1000',
    'log_dest none',
    ...(process.getuid?.() === 0 ? ['user root'] : []),
    '',
  ].join('\n');
}

/**
 * A Mosquitto of our own on a free port (mosquittoConf), for bench:ingest,
 * the scale-out test, bench:scale and the soak: the machine's broker is other
 * people's, and is never restarted or reconfigured. Throws when Mosquitto is
 * not installed.
 */
export async function privateMosquitto(): Promise<PrivateBroker> {
  if (!MOSQUITTO_BINARY) throw new Error('mosquitto is not installed');
  const dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-scale-mqtt-'));
  const port = await anyFreePort();
  const conf = path.join(dir, 'mosquitto.conf');
  writeFileSync(conf, mosquittoConf({ port }));
  const child = spawn(MOSQUITTO_BINARY, ['-c', conf], { stdio: 'ignore' });
  for (let i = 0; i < 50 && !(await reachable(port)); i++) await new Promise((r) => setTimeout(r, 100));
  if (!(await reachable(port))) {
    child.kill('SIGKILL');
    rmSync(dir, { recursive: true, force: true });
    throw new Error(`mosquitto did not listen on port ${port}`);
  }
  return {
    url: `mqtt://127.0.0.1:${port}`,
    pid: child.pid!,
    close: async () => {
      if (child.exitCode === null && child.signalCode === null) {
        const exited = new Promise((r) => child.once('exit', r));
        child.kill('SIGTERM');
        await exited;
      }
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
