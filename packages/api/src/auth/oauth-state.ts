/**
 * Where sign-in keeps its OAuth `state` (and the path to return to) between the start and the
 * callback: a short-lived cookie of its own instead of a session row, so a visit to the sign-in
 * start that never comes back stores nothing (such visits once made two in five session rows).
 * The callback is a top-level GET navigation from GitHub, which a SameSite=Lax cookie reaches.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, Response } from 'express';
import { readCookie } from './csrf.js';

const COOKIE = 'rolloff_oauth_state';
const cookieOptions = { httpOnly: true, sameSite: 'lax', path: '/auth', maxAge: 10 * 60_000 } as const;

interface Pending {
  state: string;
  returnTo?: string;
}

type Stored = (error: Error | null, state?: string) => void;
type Verified = (error: Error | null, ok: boolean, info?: { message: string }) => void;

/** The response of a request: Express links them both ways. */
const responseOf = (req: Request): Response => req.res as Response;

function pendingOf(req: Request): Pending | null {
  const value = readCookie(req, COOKIE);
  if (!value) return null;
  try {
    const parsed = JSON.parse(Buffer.from(value, 'base64url').toString('utf8')) as Partial<Pending>;
    return typeof parsed.state === 'string' ? { state: parsed.state, returnTo: typeof parsed.returnTo === 'string' ? parsed.returnTo : undefined } : null;
  } catch {
    return null;
  }
}

/**
 * A passport-oauth2 state store on that cookie, marked Secure when `secure` (PUBLIC_URL is
 * https). The sign-in start puts the (validated) path to return to in `res.locals.returnTo`;
 * after a verified callback it is there again.
 */
export const cookieStateStore = (secure: boolean) => ({
  store(req: Request, _meta: unknown, callback: Stored): void {
    const state = randomBytes(24).toString('base64url');
    const res = responseOf(req);
    const pending: Pending = { state, returnTo: res.locals.returnTo as string | undefined };
    res.cookie(COOKIE, Buffer.from(JSON.stringify(pending)).toString('base64url'), { ...cookieOptions, secure });
    callback(null, state);
  },

  verify(req: Request, state: string, _meta: unknown, callback: Verified): void {
    const res = responseOf(req);
    const pending = pendingOf(req);
    res.clearCookie(COOKIE, { path: cookieOptions.path });
    const expected = Buffer.from(pending?.state ?? '');
    const given = Buffer.from(typeof state === 'string' ? state : '');
    if (!pending || expected.length !== given.length || !timingSafeEqual(expected, given)) {
      callback(null, false, { message: 'Invalid authorization request state.' });
      return;
    }
    res.locals.returnTo = pending.returnTo;
    callback(null, true);
  },
});
