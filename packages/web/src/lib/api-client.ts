/**
 * The one HTTP client of the web app: JSON in and out, the API's `{ error, message }`
 * shape turned into an ApiError, responses checked against the shared zod contract.
 */
import type { z } from 'zod';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly id: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

interface ErrorBody {
  error?: string;
  message?: string;
  details?: unknown;
}

export interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
}

/** Fetches `path`, parses the JSON answer with `schema`; a non-2xx answer throws ApiError. */
export async function apiRequest<T>(path: string, schema: z.ZodType<T>, options: RequestOptions = {}): Promise<T> {
  const response = await fetch(path, {
    method: options.method ?? 'GET',
    headers: options.body === undefined ? { accept: 'application/json' } : { 'content-type': 'application/json', accept: 'application/json' },
    body: options.body === undefined ? undefined : JSON.stringify(options.body),
    credentials: 'same-origin',
    signal: options.signal,
  });
  const text = await response.text();
  const json: unknown = text ? JSON.parse(text) : null;
  if (!response.ok) {
    const body = (json ?? {}) as ErrorBody;
    throw new ApiError(response.status, body.error ?? 'internal', body.message ?? response.statusText, body.details);
  }
  return schema.parse(json);
}
