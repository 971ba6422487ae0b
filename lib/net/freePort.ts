import net from 'node:net';

/** True when nothing listens on 127.0.0.1:port (we could bind it). */
export function isPortFree(port: number, host = '127.0.0.1'): Promise<boolean> {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.listen({ port, host, exclusive: true }, () => server.close(() => resolve(true)));
  });
}

/** A port the OS says is free right now. */
export function anyFreePort(host = '127.0.0.1'): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen({ port: 0, host, exclusive: true }, () => {
      const { port } = server.address() as net.AddressInfo;
      server.close(() => resolve(port));
    });
  });
}

/** The preferred port when it is free, else any free port (0 means any). */
export async function preferredOrFreePort(preferred: number): Promise<number> {
  return preferred !== 0 && (await isPortFree(preferred)) ? preferred : anyFreePort();
}
