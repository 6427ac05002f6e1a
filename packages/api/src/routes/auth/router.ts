/**
 * `/auth`: GitHub sign-in (real or the local stand-in), its callback, and sign-out.
 * After sign-in the browser goes to `/notebooks` (or the `returnTo` path it asked for).
 */
import { Router } from 'express';
import type { Auth } from '../../auth/setup.js';
import { SESSION_COOKIE } from '../../contract/common.js';
import { validate } from '../../validate.js';
import { messagePage } from './pages.js';
import { SignInStartSchema } from './schema.js';

const refusals: Record<string, { status: number; title: string; message: string }> = {
  disabled: { status: 403, title: 'This account is disabled', message: 'An admin of this Rolloff has disabled your account. Ask them to enable it again.' },
  'login-taken': { status: 409, title: 'That login is taken', message: 'Another account already uses this login here. Ask an admin to sort it out.' },
};

export function authRouter(auth: Auth): Router {
  const router = Router();
  const start = validate({ query: SignInStartSchema });

  router.get('/github', start, (req, res, next) => {
    if (!auth.signInAvailable) {
      res
        .status(503)
        .type('html')
        .send(
          messagePage(
            'Sign-in is not set up',
            'Set OAUTH_BASE_URL (the local stand-in) or GITHUB_CLIENT_ID and GITHUB_CLIENT_SECRET, then restart the server.',
            { href: '/', text: 'Back to Rolloff' },
          ),
        );
      return;
    }
    const { query } = start.input(req);
    // Kept with the OAuth state in its cookie (auth/oauth-state.ts), not in a session.
    res.locals.returnTo = query.returnTo;
    auth.passport.authenticate('github', { login: query.login } as object)(req, res, next);
  });

  router.get('/github/callback', (req, res, next) => {
    if (!auth.signInAvailable) return next();
    auth.passport.authenticate('github', (error: unknown, user: Express.User | false, info?: { message?: string }) => {
      if (error) {
        console.error('sign-in failed:', error);
        res
          .status(502)
          .type('html')
          .send(
            messagePage('Sign-in did not complete', 'GitHub (or the sign-in stand-in) did not answer as expected. Try again in a moment.', {
              href: '/auth/github',
              text: 'Sign in again',
            }),
          );
        return;
      }
      if (!user) {
        const refusal = refusals[info?.message ?? ''];
        res
          .status(refusal?.status ?? 401)
          .type('html')
          .send(
            messagePage(refusal?.title ?? 'Sign-in did not complete', refusal?.message ?? 'The sign-in was cancelled or has expired.', {
              href: '/auth/github',
              text: 'Sign in again',
            }),
          );
        return;
      }
      const returnTo = (res.locals.returnTo as string | undefined) ?? '/notebooks';
      req.logIn(user, (loginError) => {
        if (loginError) return next(loginError);
        res.redirect(302, returnTo);
      });
    })(req, res, next);
  });

  router.post('/logout', (req, res, next) => {
    req.logout((logoutError) => {
      if (logoutError) return next(logoutError);
      req.session.destroy((destroyError) => {
        if (destroyError) return next(destroyError);
        res.clearCookie(SESSION_COOKIE, { path: '/', httpOnly: true, sameSite: 'lax' });
        res.status(204).end();
      });
    });
  });

  return router;
}
