/**
 * API errors: a handful of factories with stable ids, and one middleware that serialises
 * them as `{ error, message, details }`. Anything unknown becomes `internal` without details.
 */
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ACQUIRE_TIMEOUT } from './db/request-timeouts.js';
import { isRetryable } from './db/retryable.js';

export type ErrorId =
  'not_found' | 'validation' | 'conflict' | 'unauthenticated' | 'forbidden' | 'too_large' | 'key_reused' | 'rate_limited' | 'unavailable' | 'internal';

const statusOf: Record<ErrorId, number> = {
  not_found: 404,
  validation: 400,
  conflict: 409,
  unauthenticated: 401,
  forbidden: 403,
  too_large: 413,
  key_reused: 422,
  rate_limited: 429,
  unavailable: 503,
  internal: 500,
};

export class ApiError extends Error {
  constructor(
    readonly id: ErrorId,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }

  get status(): number {
    return statusOf[this.id];
  }
}

export const notFound = (what = 'That') => new ApiError('not_found', `${what} was not found.`);
export const validation = (message: string, details?: unknown) => new ApiError('validation', message, details);
export const conflict = (message: string, details?: unknown) => new ApiError('conflict', message, details);
export const unauthenticated = () => new ApiError('unauthenticated', 'Sign in first.');
export const forbidden = (message = 'You may not do that.') => new ApiError('forbidden', message);
export const tooLarge = (message: string) => new ApiError('too_large', message);
export const unavailable = (message: string) => new ApiError('unavailable', message);

/** The body an error is answered with. */
export function errorBody(error: ApiError): { error: ErrorId; message: string; details?: unknown } {
  return { error: error.id, message: error.message, ...(error.details === undefined ? {} : { details: error.details }) };
}

/** Answers 404 for any /api route that nothing handled. */
export const unknownRoute: RequestHandler = (req, _res, next) => {
  next(new ApiError('not_found', `No API route ${req.method} ${req.path}.`));
};

interface BodyParserError {
  type?: string;
  status?: number;
  expose?: boolean;
}

/** Turns body-parser's own errors (bad JSON, too large) into our ids. */
function fromBodyParser(error: BodyParserError): ApiError | null {
  if (error.type === 'entity.parse.failed') return validation('The request body is not valid JSON.');
  if (error.type === 'entity.too.large') return tooLarge('The request body is too large.');
  if (error.type === 'encoding.unsupported' || error.type === 'charset.unsupported') {
    return validation('The request body uses an encoding the API does not read.');
  }
  if (typeof error.status === 'number' && error.status >= 400 && error.status < 500 && error.expose) {
    return validation('The request could not be read.');
  }
  return null;
}

const unreachable = new Set(['ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'PROTOCOL_CONNECTION_LOST', 'ER_CON_COUNT_ERROR']);
/** The time limits of db/request-timeouts.ts: the pool's, the driver's and MariaDB's own. */
const tooSlow = new Set([ACQUIRE_TIMEOUT, 'PROTOCOL_SEQUENCE_TIMEOUT', 'ER_STATEMENT_TIMEOUT']);
/** MariaDB errors mysql2 gives no code name, by number: 1969 is max_statement_time's. */
const unnamed: Record<number, string> = { 1969: 'ER_STATEMENT_TIMEOUT' };

interface DatabaseError {
  code?: string;
  errno?: number;
  driverError?: { code?: string; errno?: number };
}

/** A database that cannot be reached, is too slow or too busy is a 503 the client may retry, not an internal error. */
function fromDatabase(error: DatabaseError | null): ApiError | null {
  const code = error?.code ?? error?.driverError?.code ?? unnamed[error?.errno ?? error?.driverError?.errno ?? 0];
  if (code && unreachable.has(code)) return unavailable('The database is not answering; try again in a moment.');
  if (code && tooSlow.has(code)) return unavailable('The database did not answer in time; try again in a moment.');
  if (isRetryable(error)) return unavailable('The database was too busy to finish this; nothing was changed. Try again in a moment.');
  return null;
}

export const errorMiddleware: ErrorRequestHandler = (error: unknown, _req, res, _next) => {
  if (res.headersSent) {
    // The answer has gone out already (a session write after it failed, say): there is no
    // error to send. A finished answer stays as it is; an unfinished one is cut, so that a
    // truncated body never looks whole.
    console.error(error);
    if (!res.writableEnded) res.destroy();
    return;
  }
  const known = error instanceof ApiError ? error : (fromBodyParser(error as BodyParserError) ?? fromDatabase(error as DatabaseError));
  if (!known) {
    console.error(error);
    res.status(500).json({ error: 'internal', message: 'Something went wrong on our side.' });
    return;
  }
  res.status(known.status).json(errorBody(known));
};
