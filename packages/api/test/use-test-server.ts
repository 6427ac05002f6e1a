/**
 * The set-up most API test files share: one test server for the enclosing `describe`,
 * closed with the database connection once its tests are done.
 */
import { afterAll, beforeAll } from 'vitest';
import { disconnect } from '../src/db/connection.js';
import { startTestServer } from './http.js';
import type { TestServer, TestServerOptions } from './http.js';

/** What a test reads of its server; closing it is the hooks' job. */
export type RunningServer = Omit<TestServer, 'close'>;

/**
 * Starts a test server before the tests of the enclosing `describe` and closes it after them.
 * The server only exists once the hooks ran, so the handle reads it lazily: use it inside
 * tests and hooks, not while the `describe` is being collected.
 */
export function useTestServer(options: TestServerOptions = {}): RunningServer {
  let server: TestServer | undefined;
  beforeAll(async () => {
    server = await startTestServer(options);
  });
  afterAll(async () => {
    await server?.close();
    await disconnect();
  });
  const running = (): TestServer => {
    if (!server) throw new Error('the test server is not running yet: use it inside a test or hook');
    return server;
  };
  return {
    get url() {
      return running().url;
    },
    get standin() {
      return running().standin;
    },
    get smtp() {
      return running().smtp;
    },
    get outbox() {
      return running().outbox;
    },
    mailbox: () => running().mailbox(),
  };
}
