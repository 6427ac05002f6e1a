/**
 * Starts the real Express app on an ephemeral loopback port for a test file, with its own
 * OAuth stand-in (also on an ephemeral port) for sign-in.
 */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import { createApp } from '../src/app.js';
import { oauthConfig } from '../src/config.js';
import type { AuthConfig } from '../src/config.js';
import { createOAuthStandin } from '../src/standins/oauth/standin.js';
import type { OAuthStandin } from '../src/standins/oauth/standin.js';

export interface TestServer {
  url: string;
  standin: OAuthStandin;
  close(): Promise<void>;
}

export interface TestServerOptions {
  webDist?: string | null;
  /** Changes to the sign-in settings the test server gets by default. */
  auth?: Partial<AuthConfig>;
}

/** The demo admin is an admin in tests too, as `npm start` makes them by default. */
export const testAdminLogins = ['mara.lindqvist'];

export async function startTestServer(options: TestServerOptions = {}): Promise<TestServer> {
  const standin = await createOAuthStandin();
  const auth: AuthConfig = {
    oauth: oauthConfig({ OAUTH_BASE_URL: standin.url }),
    publicUrl: null,
    sessionSecret: 'test-session-secret',
    adminLogins: testAdminLogins,
    ...options.auth,
  };
  const app = createApp({ webDist: options.webDist ?? null, auth });
  const server: Server = await new Promise((resolve) => {
    const s = app.listen(0, '127.0.0.1', () => resolve(s));
  });
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}`,
    standin,
    close: async () => {
      await new Promise<void>((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      });
      await standin.close();
    },
  };
}
