import type { Request, RequestHandler } from 'express';
import { unauthenticated } from '../errors.js';

/** 401 `unauthenticated` unless the request comes from a signed-in, enabled user. */
export const requireUser: RequestHandler = (req, _res, next) => {
  next(req.user && !req.user.disabled ? undefined : unauthenticated());
};

/** The signed-in user of a request that passed `requireUser`. */
export function actorOf(req: Request): Express.User {
  if (!req.user || req.user.disabled) throw unauthenticated();
  return req.user;
}
