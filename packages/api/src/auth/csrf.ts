/**
 * Cross-site request forgery protection by double-submit cookie (see the contract module's
 * doc comment): a readable token in a cookie, which every state-changing request must echo in
 * a header, plus a refusal of requests whose Origin names another site. Once signed in, the
 * token is an HMAC of the session id, so a token from another session (stolen, or left from
 * before sign-in) is refused; before sign-in it is random.
 */
import { createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Request, RequestHandler } from 'express';
import onHeaders from 'on-headers';
import { CSRF_COOKIE, CSRF_HEADER } from '../contract/common.js';
import { forbidden } from '../errors.js';

export interface CsrfSettings {
  /** The server's session secret, which keys the HMAC. */
  secret: string;
  /** Whether the cookie is marked Secure (PUBLIC_URL is https). */
  secure: boolean;
}

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

/** The token of the session `sessionId`. */
export function sessionToken(secret: string, sessionId: string): string {
  return createHmac('sha256', secret).update(`csrf:${sessionId}`).digest('base64url');
}

/** The id of the request's session when someone is signed in on it, else null. */
function signedInSession(req: Request): string | null {
  return req.user && req.sessionID ? req.sessionID : null;
}

/**
 * Sets the CSRF cookie as an answer goes out (after sign-in has given the session its new
 * id): the session's token when signed in, else the random token the browser has, or a new one.
 */
export function csrfCookie({ secret, secure }: CsrfSettings): RequestHandler {
  return (req, res, next) => {
    onHeaders(res, () => {
      const current = readCookie(req, CSRF_COOKIE);
      const sessionId = signedInSession(req);
      const token = sessionId ? sessionToken(secret, sessionId) : current && tokenPattern.test(current) ? current : randomBytes(24).toString('base64url');
      if (token !== current) res.cookie(CSRF_COOKIE, token, { httpOnly: false, sameSite: 'lax', secure, path: '/', maxAge: 365 * 24 * 3_600_000 });
    });
    next();
  };
}

function sameToken(a: string, b: string): boolean {
  const left = Buffer.from(a);
  const right = Buffer.from(b);
  return left.length === right.length && timingSafeEqual(left, right);
}

/**
 * Refuses a state-changing request that names a foreign Origin, is marked cross-site by the
 * browser, lacks the header matching the cookie, or (signed in) carries another session's
 * token. `publicUrl` is the product's address (null: the request's own host is the only site).
 */
export function csrfCheck(publicUrl: string | null, secret: string): RequestHandler {
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
    const sessionId = signedInSession(req);
    if (sessionId && !sameToken(header, sessionToken(secret, sessionId))) {
      return next(
        forbidden(`This CSRF token belongs to another session: reload the page, then send the ${CSRF_COOKIE} cookie's new value in the ${CSRF_HEADER} header.`),
      );
    }
    next();
  };
}
