/**
 * For watching several server processes share the load (cluster.ts): with
 * `API_WORKER_HEADER=1`, every response names the process that answered it in
 * `X-Rolloff-Worker`. Off by default, so a public server does not hand out process ids.
 */
import type { Server } from 'node:http';

export const WORKER_HEADER = 'X-Rolloff-Worker';

export function nameWorkerInResponses(server: Server, env: NodeJS.ProcessEnv = process.env): void {
  if (env.API_WORKER_HEADER !== '1') return;
  server.prependListener('request', (_req, res) => res.setHeader(WORKER_HEADER, String(process.pid)));
}
