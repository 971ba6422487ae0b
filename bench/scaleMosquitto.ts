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
 * A Mosquitto of our own on a free port, for the scale-out test, bench:scale
 * and the soak: the machine's broker is other people's, and is never
 * restarted or reconfigured. Configured as the README advises for ingest (a
 * deep per-client queue, so a flood never makes the broker drop QoS 1
 * messages). Shared subscriptions ($share/GROUP/…) need no setting: MQTT 5
 * brokers have them on. Throws when Mosquitto is not installed.
 */
export async function privateMosquitto(): Promise<PrivateBroker> {
  if (!MOSQUITTO_BINARY) throw new Error('mosquitto is not installed');
  const dir = mkdtempSync(path.join(os.tmpdir(), 'holdfast-scale-mqtt-'));
  const port = await anyFreePort();
  const conf = path.join(dir, 'mosquitto.conf');
  writeFileSync(
    conf,
    [
      `listener ${port} 127.0.0.1`,
      'allow_anonymous true',
      'persistence false',
      'max_queued_messages 1000000',
      'max_inflight_messages 1000',
      // Started as root, Mosquitto would otherwise switch to the "mosquitto" user.
      ...(process.getuid?.() === 0 ? ['user root'] : []),
      '',
    ].join('\n'),
  );
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
