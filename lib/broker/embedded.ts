import net from 'node:net';
import { Aedes } from 'aedes';
import { preferredOrFreePort } from '../net/freePort';

export interface EmbeddedBroker {
  url: string;
  port: number;
  stop(): Promise<void>;
}

/**
 * An in-process MQTT 3.1.1 broker (aedes) on 127.0.0.1. Sessions and queued
 * QoS 1 messages live in memory: enough for the demo and tests; a production
 * fleet uses an external broker (MQTT_URL).
 */
export async function startEmbeddedBroker(preferredPort: number): Promise<EmbeddedBroker> {
  const port = await preferredOrFreePort(preferredPort);
  const broker = await Aedes.createBroker();
  const server = net.createServer(broker.handle);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  return {
    url: `mqtt://127.0.0.1:${port}`,
    port,
    stop: () =>
      new Promise<void>((resolve) => {
        // The broker disconnects its clients first, so the server can close.
        broker.close(() => server.close(() => resolve()));
      }),
  };
}
