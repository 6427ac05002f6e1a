/** Starts the real Express app on an ephemeral loopback port for a test file. */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createApp } from '../src/app.js';
import type { AppOptions } from '../src/app.js';

export interface TestServer {
  url: string;
  close(): Promise<void>;
}

export async function startTestServer(options: AppOptions = { webDist: null }): Promise<TestServer> {
  const app = createApp(options);
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    close: () =>
      new Promise((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
