/**
 * The rate limits, through express-rate-limit with the MariaDB store (store.ts): sign-in
 * starts and callbacks per address; writes, and the reads that cost the database most, per
 * address and per signed-in user. Past a limit the answer is 429 `rate_limited` in the API's
 * error shape, with `Retry-After`. A store that cannot answer lets the request through:
 * the database it shares with the request then says what is wrong.
 */
import { rateLimit, ipKeyGenerator } from 'express-rate-limit';
import type { RateLimitInfo } from 'express-rate-limit';
import { Router } from 'express';
import type { Request, RequestHandler } from 'express';
import type { DataSource } from 'typeorm';
import type { RateLimitConfig, RequestLimit } from '../config.js';
import { ApiError } from '../errors.js';
import { MariaDbStore } from './store.js';

export interface Limiters {
  /** `/auth/github` and its callback. */
  signIn: RequestHandler;
  /** Every POST, PUT, PATCH and DELETE under /api. */
  writes: RequestHandler;
  /** GETs of notebooks and people. */
  reads: RequestHandler;
}

type Client = 'address' | 'user';

const reading = (req: Request) => req.method === 'GET' || req.method === 'HEAD';

/** One limiter: `name` keys its counters; a null key (nobody signed in, for a per-user limit) is not counted. */
function limiter(
  name: string,
  what: string,
  client: Client,
  windowMs: number,
  limit: number,
  counts: (req: Request) => boolean,
  database: () => Promise<DataSource>,
): RequestHandler {
  const keyOf = (req: Request): string | null => (client === 'address' ? `ip:${ipKeyGenerator(req.ip ?? 'unknown')}` : req.user ? `user:${req.user.id}` : null);
  const minutes = windowMs / 60_000;
  const per = minutes === 1 ? 'a minute' : `in ${minutes} minutes`;
  return rateLimit({
    windowMs,
    limit,
    store: new MariaDbStore(`${name}-${client}`, database),
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    passOnStoreError: true,
    skip: (req) => !counts(req) || keyOf(req) === null,
    keyGenerator: (req) => keyOf(req)!,
    handler: (req, res, next) => {
      const { resetTime } = (req as Request & { rateLimit: RateLimitInfo }).rateLimit;
      const seconds = Math.max(1, Math.ceil(((resetTime?.getTime() ?? Date.now() + windowMs) - Date.now()) / 1000));
      res.set('Retry-After', String(seconds));
      const from = client === 'address' ? 'from your address' : 'from your account';
      next(
        new ApiError('rate_limited', `Too many ${what} ${from}: at most ${limit} ${per}. Try again in ${seconds} s.`, {
          limit,
          windowSeconds: windowMs / 1000,
          retryAfterSeconds: seconds,
        }),
      );
    },
  });
}

/** The per-address and per-user limiters of one kind of request, in turn; a limit of 0 adds none. */
function both(name: string, what: string, limits: RequestLimit, counts: (req: Request) => boolean, database: () => Promise<DataSource>): RequestHandler {
  const router = Router();
  for (const client of ['address', 'user'] as const) {
    const limit = client === 'address' ? limits.perAddress : limits.perUser;
    if (limit > 0) router.use(limiter(name, what, client, limits.windowMs, limit, counts, database));
  }
  return router;
}

export function createLimiters(config: RateLimitConfig, database: () => Promise<DataSource>): Limiters {
  return {
    signIn: both('sign-in', 'sign-in attempts', { ...config.signIn, perUser: 0 }, () => true, database),
    writes: both('writes', 'changes', config.writes, (req) => !reading(req) && req.method !== 'OPTIONS', database),
    reads: both('reads', 'reads of notebooks and people', config.reads, reading, database),
  };
}
