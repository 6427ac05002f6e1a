/**
 * The one HTTP client of the web app: JSON in and out, the CSRF token sent on every
 * state-changing request, the API's `{ error, message }` shape turned into an ApiError,
 * responses checked against the shared zod contract, and a 401 reported in one place.
 */
import { CSRF_COOKIE, CSRF_HEADER, ErrorBodySchema } from '@rolloff/api/contract';
import type { z } from 'zod';
import { apiPaths } from './paths';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly id: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }

  /** True when the request never got an answer (offline, server down, gateway errors). */
  get unreachable(): boolean {
    return this.status === 0 || this.status === 502 || this.status === 503 || this.status === 504;
  }
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
  /** A 401 here is an expected answer (the "who am I" check), not a lost session. */
  quietUnauthenticated?: boolean;
  /** Headers of this call (an Idempotency-Key). */
  headers?: Record<string, string>;
}

type Listener = () => void;
const unauthenticatedListeners = new Set<Listener>();

/** Calls `listener` whenever a request finds the session gone; returns the unsubscribe. */
export function onUnauthenticated(listener: Listener): () => void {
  unauthenticatedListeners.add(listener);
  return () => unauthenticatedListeners.delete(listener);
}

/** The CSRF token the server gave this browser, if it has given one yet. */
export function csrfToken(): string | null {
  for (const part of document.cookie.split(';')) {
    const [name, ...rest] = part.trim().split('=');
    if (name === CSRF_COOKIE) return decodeURIComponent(rest.join('='));
  }
  return null;
}

/** Any API answer sets the CSRF cookie; ask for one cheaply when it is missing. */
async function ensureCsrfToken(): Promise<string | null> {
  const token = csrfToken();
  if (token) return token;
  await fetch(apiPaths.health(), { credentials: 'same-origin' }).catch(() => undefined);
  return csrfToken();
}

function parseJson(text: string): unknown {
  if (!text) return null;
  try {
    return JSON.parse(text);
  } catch {
    return undefined;
  }
}

/** Fetches `path`, parses the JSON answer with `schema`; a non-2xx answer throws ApiError. */
export async function apiRequest<T>(path: string, schema: z.ZodType<T>, options: RequestOptions = {}): Promise<T> {
  const method = options.method ?? 'GET';
  const headers: Record<string, string> = { accept: 'application/json', ...options.headers };
  if (options.body !== undefined) headers['content-type'] = 'application/json';
  if (method !== 'GET') {
    const token = await ensureCsrfToken();
    if (token) headers[CSRF_HEADER] = token;
  }
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      headers,
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
      credentials: 'same-origin',
      signal: options.signal,
    });
  } catch (error) {
    if (options.signal?.aborted) throw error;
    throw new ApiError(0, 'unreachable', 'The server cannot be reached. Check the connection; nothing is lost.');
  }
  const json = parseJson(await response.text());
  if (!response.ok) {
    if (response.status === 401 && !options.quietUnauthenticated) unauthenticatedListeners.forEach((listener) => listener());
    const body = ErrorBodySchema.safeParse(json);
    if (body.success) throw new ApiError(response.status, body.data.error, body.data.message, body.data.details);
    throw new ApiError(response.status, 'internal', `The server answered ${response.status} ${response.statusText}.`.replace(/ \.$/, '.'));
  }
  if (json === undefined) throw new ApiError(response.status, 'internal', 'The server sent an answer that is not JSON.');
  const parsed = schema.safeParse(json);
  if (!parsed.success)
    throw new ApiError(
      response.status,
      'internal',
      `The server's answer did not have the expected shape (${parsed.error.issues[0]?.path.join('.') || 'body'}).`,
    );
  return parsed.data;
}
