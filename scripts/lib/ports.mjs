// Port checks, so a clash stops with a clear message instead of a stack trace later.
import net from 'node:net';
import { fail } from './log.mjs';

/** Resolves true when nothing listens on host:port. */
export function isPortFree(port, host = '127.0.0.1') {
  return new Promise((resolve) => {
    const server = net.createServer();
    server.once('error', () => resolve(false));
    server.once('listening', () => server.close(() => resolve(true)));
    server.listen(port, host);
  });
}

export async function requireFreePort(port, what, variable) {
  if (!(await isPortFree(port))) {
    fail(`Port ${port} (${what}) is already in use. Stop whatever listens there, or set ${variable} to another port.`);
  }
}

/** Polls until host:port accepts a TCP connection or the timeout passes. */
export async function waitForPort(port, timeoutMs, host = '127.0.0.1') {
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const open = await new Promise((resolve) => {
      const socket = net.connect(port, host);
      socket.once('connect', () => {
        socket.destroy();
        resolve(true);
      });
      socket.once('error', () => resolve(false));
    });
    if (open) return true;
    await new Promise((r) => setTimeout(r, 100));
  }
  return false;
}
