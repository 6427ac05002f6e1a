/**
 * Cross-site request forgery protection by double-submit cookie (see the contract module's
 * doc comment): a readable random token in a cookie, which every state-changing request must
 * echo in a header, plus a refusal of requests whose Origin names another site.
 */
import { randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import { CSRF_COOKIE, CSRF_HEADER } from '../contract/common.js';
import { forbidden } from '../errors.js';

const tokenPattern = /^[A-Za-z0-9_-]{32,128}$/;
const unsafeMethods = new Set(['POST', 'PUT', 'PATCH', 'DELETE']);

/** One cookie's value from the Cookie header, or undefined. */
export function readCookie(req: Request, name: string): string | undefined {
  const header = req.headers.cookie;
  if (!header) return undefined;
  for (const part of header.split(';')) {
    const eq = part.indexOf('=');
    if (eq < 0 || part.slice(0, eq).trim() !== name) continue;
    try {
      return decodeURIComponent(part.slice(eq + 1).trim());
    } catch {
      return undefined;
    }
  }
  return undefined;
}

/** Sets the CSRF cookie on any response to a request that came without a valid one. */
export const csrfCookie: RequestHandler = (req, res, next) => {
  const token = readCookie(req, CSRF_COOKIE);
  if (!token || !tokenPattern.test(token)) {
    res.cookie(CSRF_COOKIE, randomBytes(24).toString('base64url'), {
      httpOnly: false,
      sameSite: 'lax',
      secure: req.secure,
      path: '/',
      maxAge: 365 * 24 * 3_600_000,
    });
  }
  next();
};

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

/**
 * Refuses a state-changing request that names a foreign Origin, is marked cross-site by the
 * browser, or lacks the header matching the cookie. `publicUrl` is the product's address
 * (null: the request's own host is the only site).
 */
export function csrfCheck(publicUrl: string | null): RequestHandler {
  const publicOrigin = publicUrl ? new URL(publicUrl).origin : null;
  return (req, _res, next) => {
    if (!unsafeMethods.has(req.method)) return next();
    const origin = req.headers.origin;
    if (origin !== undefined) {
      const own = `${req.protocol}://${req.get('host') ?? ''}`;
      if (origin !== own && origin !== publicOrigin) {
        return next(forbidden(`Cross-site request refused: the Origin ${origin} is not this site.`));
      }
    }
    if (req.headers['sec-fetch-site'] === 'cross-site') {
      return next(forbidden('Cross-site request refused.'));
    }
    const cookie = readCookie(req, CSRF_COOKIE);
    const header = req.get(CSRF_HEADER);
    if (!cookie || !header || !sameToken(cookie, header)) {
      return next(forbidden(`Missing or wrong CSRF token: send the value of the ${CSRF_COOKIE} cookie in the ${CSRF_HEADER} header.`));
    }
    next();
  };
}
