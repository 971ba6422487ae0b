import net from 'node:net';

/**
 * A TCP relay on 127.0.0.1:port to a real service, opened when a test
 * decides: until then the port refuses connections, as a database or
 * broker that is not up yet does. Lets the start-up tests make the shared
 * PostgreSQL and broker "unreachable" without touching them.
 */
export interface TcpRelay {
  close(): Promise<void>;
}

export async function openRelay(port: number, target: { host: string; port: number }): Promise<TcpRelay> {
  const sockets = new Set<net.Socket>();
  const server = net.createServer((inbound) => {
    const outbound = net.connect(target.port, target.host);
    for (const s of [inbound, outbound]) {
      sockets.add(s);
      s.on('close', () => sockets.delete(s));
    }
    inbound.on('error', () => outbound.destroy());
    outbound.on('error', () => inbound.destroy());
    inbound.pipe(outbound).pipe(inbound);
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', resolve);
  });
  return {
    close: () =>
      new Promise<void>((resolve) => {
        for (const s of sockets) s.destroy();
        server.close(() => resolve());
      }),
  };
}
