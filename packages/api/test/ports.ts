import net from 'node:net';
import type { AddressInfo } from 'node:net';

/** A loopback port that was free a moment ago. */
export function isolatedPort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.once('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const { port } = server.address() as AddressInfo;
      server.close(() => resolve(port));
    });
  });
}
