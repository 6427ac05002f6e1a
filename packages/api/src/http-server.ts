/**
 * The HTTP server around the app, with limits on slow clients: Node's own defaults let a
 * request that never finishes its headers hold a connection for a minute and one that never
 * finishes its body for five, so a few such connections could tie the server up.
 */
import http from 'node:http';
import type { Express } from 'express';

export interface HttpLimits {
  /** From the connection's first byte to the end of the request's headers. */
  headersMs: number;
  /** From the first byte to the end of the whole request, body included (the largest body is 1 MB). */
  requestMs: number;
}

export const httpLimits: HttpLimits = { headersMs: 10_000, requestMs: 30_000 };

/** An HTTP server for `app` that answers 408 and closes a connection past `limits`. */
export function createHttpServer(app: Express, limits: HttpLimits = httpLimits): http.Server {
  return http.createServer(
    {
      headersTimeout: limits.headersMs,
      requestTimeout: limits.requestMs,
      // How often Node looks for connections past their limits (30 s by default).
      connectionsCheckingInterval: Math.min(1000, limits.headersMs / 2),
    },
    app,
  );
}
