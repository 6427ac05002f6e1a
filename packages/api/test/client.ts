/**
 * A small HTTP client for tests that behaves like a browser tab: it keeps cookies, sends the
 * CSRF header the web app sends, and signs in by following the OAuth redirects by hand.
 */
import { CSRF_COOKIE, CSRF_HEADER } from '../src/contract/common.js';

export interface Reply<T = unknown> {
  status: number;
  headers: Headers;
  body: T;
  text: string;
}

export interface RequestOptions {
  /** Extra headers (e.g. a foreign Origin). */
  headers?: Record<string, string>;
  /** Send no CSRF header even though the cookie is known. */
  noCsrf?: boolean;
  /** A raw body sent as is (for malformed JSON); `body` is JSON-encoded otherwise. */
  raw?: string;
}

/** Cookies by name, per client (all test servers are on 127.0.0.1, so one jar per client). */
export class CookieJar {
  private readonly cookies = new Map<string, string>();

  /** Takes the Set-Cookie headers of a response. */
  store(headers: Headers): void {
    for (const line of headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair!.indexOf('=');
      const name = pair!.slice(0, eq).trim();
      const value = pair!.slice(eq + 1).trim();
      const expired = /expires=Thu, 01 Jan 1970/i.test(line) || /max-age=0/i.test(line);
      if (expired || value === '') this.cookies.delete(name);
      else this.cookies.set(name, value);
    }
  }

  get(name: string): string | undefined {
    const value = this.cookies.get(name);
    return value === undefined ? undefined : decodeURIComponent(value);
  }

  set(name: string, value: string): void {
    this.cookies.set(name, encodeURIComponent(value));
  }

  delete(name: string): void {
    this.cookies.delete(name);
  }

  header(): string {
    return [...this.cookies].map(([name, value]) => `${name}=${value}`).join('; ');
  }
}

export class Client {
  readonly jar = new CookieJar();

  constructor(readonly baseUrl: string) {}

  /** One request without following redirects; cookies are kept and sent. */
  async fetch(url: string, init: RequestInit = {}): Promise<Response> {
    const headers = new Headers(init.headers);
    const target = new URL(url, this.baseUrl);
    // Only our own server (and its stand-in) get our cookies; both are on loopback.
    if (target.hostname === '127.0.0.1' && this.jar.header()) headers.set('cookie', this.jar.header());
    const response = await fetch(target, { ...init, headers, redirect: 'manual' });
    this.jar.store(response.headers);
    return response;
  }

  async request<T = unknown>(method: string, path: string, body?: unknown, options: RequestOptions = {}): Promise<Reply<T>> {
    const headers: Record<string, string> = { accept: 'application/json', ...options.headers };
    if (method !== 'GET' && method !== 'HEAD') {
      if (!this.jar.get(CSRF_COOKIE)) await this.fetch('/api/health');
      const token = this.jar.get(CSRF_COOKIE);
      if (token && !options.noCsrf) headers[CSRF_HEADER] = token;
    }
    let payload: string | undefined = options.raw;
    if (payload === undefined && body !== undefined) payload = JSON.stringify(body);
    if (payload !== undefined && !headers['content-type']) headers['content-type'] = 'application/json';
    const response = await this.fetch(path, { method, headers, body: payload });
    const text = await response.text();
    let parsed: unknown = text;
    try {
      parsed = text ? JSON.parse(text) : null;
    } catch {
      // Not JSON (an HTML page): the text is the body.
    }
    return { status: response.status, headers: response.headers, body: parsed as T, text };
  }

  get<T = unknown>(path: string, options?: RequestOptions) {
    return this.request<T>('GET', path, undefined, options);
  }
  post<T = unknown>(path: string, body?: unknown, options?: RequestOptions) {
    return this.request<T>('POST', path, body, options);
  }
  put<T = unknown>(path: string, body?: unknown, options?: RequestOptions) {
    return this.request<T>('PUT', path, body, options);
  }
  patch<T = unknown>(path: string, body?: unknown, options?: RequestOptions) {
    return this.request<T>('PATCH', path, body, options);
  }
  delete<T = unknown>(path: string, options?: RequestOptions) {
    return this.request<T>('DELETE', path, undefined, options);
  }

  /**
   * Signs in through the OAuth stand-in as `login` (`/auth/github?login=`), following each
   * redirect by hand; returns every hop, the last being the landing page.
   */
  async signIn(login: string): Promise<{ hops: { url: string; status: number }[]; landing: Response }> {
    const hops: { url: string; status: number }[] = [];
    let url = new URL(`/auth/github?login=${encodeURIComponent(login)}`, this.baseUrl).toString();
    for (let i = 0; i < 6; i++) {
      const response = await this.fetch(url);
      hops.push({ url, status: response.status });
      const location = response.headers.get('location');
      if (response.status < 300 || response.status >= 400 || !location) return { hops, landing: response };
      await response.arrayBuffer();
      url = new URL(location, url).toString();
      if (new URL(url).pathname === '/notebooks') return { hops: [...hops, { url, status: 0 }], landing: response };
    }
    throw new Error(`sign-in as ${login} did not finish: ${JSON.stringify(hops)}`);
  }
}

/** A client signed in as `login`; fails the test if sign-in did not reach /notebooks. */
export async function signedIn(baseUrl: string, login: string): Promise<Client> {
  const client = new Client(baseUrl);
  const { hops } = await client.signIn(login);
  const last = hops[hops.length - 1]!;
  if (new URL(last.url).pathname !== '/notebooks') throw new Error(`sign-in as ${login} ended at ${last.url} (${last.status})`);
  return client;
}
