// A signed-in session for the load scripts, as a browser tab has one: cookies kept by hand,
// sign-in through the OAuth stand-in by following its redirects, and the CSRF token the web
// app echoes on every write. Plain Node (fetch), so the scripts need nothing else for it.

const CSRF_COOKIE = 'rolloff_csrf';
const CSRF_HEADER = 'x-csrf-token';

export class WebSession {
  #cookies = new Map();

  constructor(baseUrl) {
    this.baseUrl = baseUrl;
  }

  /** The Cookie header to send to the server. */
  get cookie() {
    return [...this.#cookies].map(([name, value]) => `${name}=${value}`).join('; ');
  }

  /** The headers of a write: cookies, the CSRF token and a JSON body. */
  writeHeaders() {
    return { cookie: this.cookie, [CSRF_HEADER]: decodeURIComponent(this.#cookies.get(CSRF_COOKIE) ?? ''), 'content-type': 'application/json' };
  }

  async fetch(url, init = {}) {
    const target = new URL(url, this.baseUrl);
    const headers = new Headers(init.headers);
    if (target.hostname === '127.0.0.1' && this.#cookies.size) headers.set('cookie', this.cookie);
    const response = await fetch(target, { ...init, headers, redirect: 'manual' });
    for (const line of response.headers.getSetCookie()) {
      const [pair] = line.split(';');
      const eq = pair.indexOf('=');
      const name = pair.slice(0, eq).trim();
      const value = pair.slice(eq + 1).trim();
      if (value === '' || /max-age=0|expires=Thu, 01 Jan 1970/i.test(line)) this.#cookies.delete(name);
      else this.#cookies.set(name, value);
    }
    return response;
  }

  /** A JSON request; throws with the answer when the status is not the expected one. */
  async json(method, path, body, expected = [200, 201]) {
    const init = { method, headers: method === 'GET' ? {} : this.writeHeaders() };
    if (body !== undefined) init.body = JSON.stringify(body);
    const response = await this.fetch(path, init);
    const text = await response.text();
    if (!expected.includes(response.status)) throw new Error(`${method} ${path} answered ${response.status}: ${text.slice(0, 300)}`);
    return text ? JSON.parse(text) : null;
  }

  /** Signs in as `login` through the stand-in, following each redirect by hand. */
  async signIn(login) {
    let url = new URL(`/auth/github?login=${encodeURIComponent(login)}`, this.baseUrl).toString();
    for (let hop = 0; hop < 6; hop++) {
      const response = await this.fetch(url);
      await response.arrayBuffer();
      const location = response.headers.get('location');
      if (response.status < 300 || response.status >= 400 || !location) break;
      url = new URL(location, url).toString();
      if (new URL(url).pathname === '/notebooks') {
        // The CSRF cookie of the signed-in session comes with the next answer.
        await this.json('GET', '/api/me');
        return this;
      }
    }
    throw new Error(`Signing in as ${login} did not reach /notebooks (stopped at ${url}).`);
  }
}

/** A new session signed in as `login` on the server at `baseUrl`. */
export function signedIn(baseUrl, login) {
  return new WebSession(baseUrl).signIn(login);
}
