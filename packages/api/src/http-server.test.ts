import net from 'node:net';
import type { AddressInfo } from 'node:net';
import express from 'express';
import { describe, expect, it } from 'vitest';
import { createHttpServer, httpLimits } from './http-server.js';

/** Sends `bytes` and never more; resolves with what the server answered once it closed, and after how long. */
function stall(port: number, bytes: string): Promise<{ answer: string; ms: number }> {
  return new Promise((resolve) => {
    const started = performance.now();
    let answer = '';
    const socket = net.connect(port, '127.0.0.1', () => socket.write(bytes));
    socket.on('data', (chunk: Buffer) => (answer += chunk.toString()));
    socket.on('close', () => resolve({ answer, ms: performance.now() - started }));
    socket.on('error', () => undefined);
  });
}

describe('the HTTP server', () => {
  it('closes a connection whose headers or body never finish, with a 408', async () => {
    const app = express();
    app.post('/echo', express.json(), (req, res) => {
      res.json(req.body);
    });
    const limits = { headersMs: 400, requestMs: 800 };
    const server = createHttpServer(app, limits);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', () => resolve()));
    const { port } = server.address() as AddressInfo;
    try {
      const [headers, body] = await Promise.all([
        stall(port, 'POST /echo HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: app'),
        stall(port, 'POST /echo HTTP/1.1\r\nHost: 127.0.0.1\r\nContent-Type: application/json\r\nContent-Length: 100\r\n\r\n{"a":'),
      ]);
      expect(headers.answer).toMatch(/^HTTP\/1\.1 408/);
      expect(body.answer).toMatch(/^HTTP\/1\.1 408/);
      // Closed near its limit (Node checks every half limit here), not after Node's minutes.
      expect(headers.ms).toBeLessThan(limits.requestMs * 4);
      expect(body.ms).toBeLessThan(limits.requestMs * 4);
    } finally {
      server.closeAllConnections();
      await new Promise((resolve) => server.close(resolve));
    }
  });

  it('keeps limits that a 1 MB body on a slow link still fits, and tighter than Node’s own', () => {
    // Node 20's defaults, from its http documentation: headersTimeout 60 s, requestTimeout 300 s.
    expect(httpLimits.headersMs).toBeLessThan(60_000);
    expect(httpLimits.requestMs).toBeLessThan(300_000);
    expect(httpLimits.requestMs).toBeGreaterThanOrEqual(httpLimits.headersMs);
  });
});
