/**
 * The local OAuth stand-in for GitHub: the OAuth 2 web flow as GitHub speaks it, on loopback.
 * `/login/oauth/authorize` (a page, or `login=NAME` to skip it) redirects back with a code;
 * `/login/oauth/access_token` swaps the code for a token (form-encoded POST, JSON answer);
 * `/user` and `/user/emails` answer with GitHub's field names for that token.
 */
import { randomBytes } from 'node:crypto';
import type { Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express from 'express';
import type { Express, Request, Response } from 'express';
import { OAUTH_CALLBACK_PATH, standinClient } from '../../config.js';
import { IdentityDirectory, identityProblem } from './identities.js';
import type { Identity } from './identities.js';
import { authorizePage } from './page.js';
import type { AuthorizeRequest } from './page.js';

export interface OAuthClient {
  id: string;
  secret: string;
  /**
   * The callback URL registered for the client. A redirect_uri must be on its scheme, host and
   * port, at its path or below, as GitHub checks. Unregistered (the local default, whose API
   * address the stand-in does not know), a redirect_uri must be the API's callback path on a
   * loopback address: sign-in codes never go to another machine.
   */
  callbackUrl?: string;
}

const loopbackHosts = new Set(['127.0.0.1', 'localhost', '[::1]']);

/** Whether `client` may be sent back to `target` with a code. */
function callbackAllows(client: OAuthClient, target: URL): boolean {
  if (!client.callbackUrl) return loopbackHosts.has(target.hostname) && target.pathname === OAUTH_CALLBACK_PATH;
  const registered = new URL(client.callbackUrl);
  const under = registered.pathname.endsWith('/') ? registered.pathname : `${registered.pathname}/`;
  return target.origin === registered.origin && (target.pathname === registered.pathname || target.pathname.startsWith(under));
}

export interface OAuthStandinOptions {
  /** 0 (the default) picks a free port. */
  port?: number;
  /** Always 127.0.0.1 unless a test says otherwise: the stand-in must not be reachable from outside. */
  host?: string;
  clients?: OAuthClient[];
}

export interface OAuthStandin {
  url: string;
  port: number;
  identities: IdentityDirectory;
  close(): Promise<void>;
}

interface Grant {
  login: string;
  clientId: string;
  redirectUri: string;
  scope: string;
  expiresAt: number;
}

const codeLifetimeMs = 10 * 60_000;
const token = () => randomBytes(20).toString('hex');

function text(value: unknown): string {
  return typeof value === 'string' ? value : '';
}

/** GitHub's JSON for a user. */
function userJson(identity: Identity, baseUrl: string) {
  return {
    login: identity.login,
    id: identity.id,
    node_id: Buffer.from(`User${identity.id}`).toString('base64'),
    avatar_url: '',
    gravatar_id: '',
    url: `${baseUrl}/users/${identity.login}`,
    html_url: `${baseUrl}/${identity.login}`,
    type: 'User',
    site_admin: false,
    name: identity.name,
    company: null,
    blog: '',
    location: null,
    email: identity.email,
    hireable: null,
    bio: null,
    public_repos: 0,
    followers: 0,
    following: 0,
    created_at: '2026-01-05T09:00:00Z',
    updated_at: '2026-01-05T09:00:00Z',
  };
}

/** Builds the stand-in's Express app (exported for tests that want it without a port). */
export function oauthStandinApp(clients: OAuthClient[], identities: IdentityDirectory, baseUrl: () => string): Express {
  const codes = new Map<string, Grant>();
  const tokens = new Map<string, { login: string; scope: string }>();
  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: false, limit: '16kb' }));
  app.use(express.json({ limit: '16kb' }));

  const clientOf = (id: string) => clients.find((client) => client.id === id);

  function readRequest(source: Record<string, unknown>): AuthorizeRequest {
    return {
      clientId: text(source.client_id),
      redirectUri: text(source.redirect_uri),
      state: text(source.state),
      scope: text(source.scope),
    };
  }

  /** A problem with the request itself: shown on the page, never redirected (as GitHub does). */
  function requestProblem(request: AuthorizeRequest): string | null {
    const client = clientOf(request.clientId);
    if (!client) return `Unknown client_id "${request.clientId}".`;
    try {
      const target = new URL(request.redirectUri);
      if (target.protocol !== 'http:' && target.protocol !== 'https:') return 'redirect_uri must be an http(s) address.';
      if (!callbackAllows(client, target)) return 'redirect_uri is not the callback URL registered for this client.';
    } catch {
      return 'redirect_uri is missing or not an address.';
    }
    return null;
  }

  function redirectBack(res: Response, request: AuthorizeRequest, params: Record<string, string>): void {
    const target = new URL(request.redirectUri);
    for (const [name, value] of Object.entries(params)) target.searchParams.set(name, value);
    if (request.state) target.searchParams.set('state', request.state);
    res.redirect(302, target.toString());
  }

  function grant(res: Response, request: AuthorizeRequest, identity: Identity): void {
    const code = token();
    codes.set(code, {
      login: identity.login,
      clientId: request.clientId,
      redirectUri: request.redirectUri,
      scope: request.scope,
      expiresAt: Date.now() + codeLifetimeMs,
    });
    redirectBack(res, request, { code });
  }

  app.get('/', (_req, res) => {
    res.type('text').send(
      'Rolloff OAuth stand-in. Identities: ' +
        identities
          .list()
          .map((i) => i.login)
          .join(', ') +
        '\n',
    );
  });

  app.get('/login/oauth/authorize', (req: Request, res: Response) => {
    const request = readRequest(req.query as Record<string, unknown>);
    const problem = requestProblem(request);
    if (problem) {
      res
        .status(400)
        .type('html')
        .send(`<!doctype html><title>Bad sign-in request</title><p>${problem.replace(/</g, '&lt;')}</p>`);
      return;
    }
    const login = text(req.query.login);
    if (login) {
      const invalid = identityProblem(login, '');
      if (!invalid) return grant(res, request, identities.findOrAdd(login));
      res
        .status(400)
        .type('html')
        .send(authorizePage(request, identities.list(), invalid));
      return;
    }
    res.type('html').send(authorizePage(request, identities.list()));
  });

  app.post('/login/oauth/authorize', (req: Request, res: Response) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    const request = readRequest(body);
    const problem = requestProblem(request);
    if (problem) {
      res
        .status(400)
        .type('html')
        .send(`<!doctype html><title>Bad sign-in request</title><p>${problem.replace(/</g, '&lt;')}</p>`);
      return;
    }
    if (body.deny) {
      return redirectBack(res, request, { error: 'access_denied', error_description: 'The user has denied your application access.' });
    }
    const login = text(body.login).trim();
    const email = text(body.email).trim();
    const invalid = identityProblem(login, email);
    if (invalid) {
      res
        .status(400)
        .type('html')
        .send(authorizePage(request, identities.list(), invalid));
      return;
    }
    grant(res, request, identities.findOrAdd(login, text(body.name).trim(), email));
  });

  app.post('/login/oauth/access_token', (req: Request, res: Response) => {
    const body = (req.body ?? {}) as Record<string, unknown>;
    const reply = (payload: Record<string, string>) => {
      // GitHub answers form-encoded unless asked for JSON; JSON is what every client here asks for.
      if (req.accepts(['json', 'application/x-www-form-urlencoded']) === 'application/x-www-form-urlencoded') {
        res.type('application/x-www-form-urlencoded').send(new URLSearchParams(payload).toString());
      } else {
        res.json(payload);
      }
    };
    const client = clientOf(text(body.client_id));
    if (!client || client.secret !== text(body.client_secret)) {
      return reply({ error: 'incorrect_client_credentials', error_description: 'The client_id and/or client_secret passed are incorrect.' });
    }
    const code = text(body.code);
    const found = codes.get(code);
    codes.delete(code);
    const redirectUri = text(body.redirect_uri);
    if (!found || found.expiresAt < Date.now() || found.clientId !== client.id || (redirectUri && redirectUri !== found.redirectUri)) {
      return reply({ error: 'bad_verification_code', error_description: 'The code passed is incorrect or expired.' });
    }
    const accessToken = `gho_${token()}`;
    tokens.set(accessToken, { login: found.login, scope: found.scope });
    reply({ access_token: accessToken, token_type: 'bearer', scope: found.scope });
  });

  function bearer(req: Request): { identity: Identity; scope: string } | null {
    const match = /^(?:bearer|token)\s+(\S+)$/i.exec(req.get('authorization') ?? '');
    const held = match ? tokens.get(match[1]!) : undefined;
    const identity = held ? identities.find(held.login) : undefined;
    return held && identity ? { identity, scope: held.scope } : null;
  }

  const unauthorized = (res: Response) => res.status(401).json({ message: 'Requires authentication', documentation_url: `${baseUrl()}/docs` });

  app.get('/user', (req, res) => {
    const holder = bearer(req);
    if (!holder) return unauthorized(res);
    res.json(userJson(holder.identity, baseUrl()));
  });

  app.get('/user/emails', (req, res) => {
    const holder = bearer(req);
    if (!holder) return unauthorized(res);
    const scopes = holder.scope.split(/[ ,]+/);
    if (!scopes.includes('user:email') && !scopes.includes('user')) {
      return res.status(404).json({ message: 'Not Found', documentation_url: `${baseUrl()}/docs` });
    }
    res.json([{ email: holder.identity.email, primary: true, verified: true, visibility: 'public' }]);
  });

  return app;
}

/** Starts the stand-in on loopback; port 0 picks a free port (as the tests do). */
export async function createOAuthStandin({ port = 0, host = '127.0.0.1', clients = [standinClient] }: OAuthStandinOptions = {}): Promise<OAuthStandin> {
  const identities = new IdentityDirectory();
  let url = '';
  const app = oauthStandinApp(clients, identities, () => url);
  const server: Server = await new Promise((resolve, reject) => {
    const s = app.listen(port, host, () => resolve(s));
    s.once('error', reject);
  });
  const actual = (server.address() as AddressInfo).port;
  url = `http://${host}:${actual}`;
  return {
    url,
    port: actual,
    identities,
    close: () =>
      new Promise((resolve) => {
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
