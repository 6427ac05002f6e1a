/**
 * The Express application: sign-in under /auth, the JSON API under /api, the development
 * mailbox at /dev/mail for site admins when the SMTP stand-in is in use, and in production the built web app
 * with a fallback to index.html for the client-side routes.
 */
import { existsSync } from 'node:fs';
import path from 'node:path';
import express from 'express';
import type { Express } from 'express';
import { csrfCheck, csrfCookie } from './auth/csrf.js';
import { createAuth } from './auth/setup.js';
import { setCellCheckBudget } from './cell-check-pool.js';
import { authConfig, mailConfig, rateLimitConfig, secureCookies } from './config.js';
import type { AuthConfig, CellCheckConfig, RateLimitConfig } from './config.js';
import { connect } from './db/connection.js';
import { errorMiddleware, unknownRoute } from './errors.js';
import type { AppMail } from './mail/notifier.js';
import type { Outbox } from './mail/outbox.js';
import { createLimiters } from './rate-limit/limiters.js';
import { adminRouter } from './routes/admin/router.js';
import { authRouter } from './routes/auth/router.js';
import { devMailRouter } from './routes/dev-mail/router.js';
import { healthRouter } from './routes/health/router.js';
import { meRouter } from './routes/me/router.js';
import { notebooksRouter } from './routes/notebooks/router.js';
import { settingsRouter } from './routes/settings/router.js';
import { usersRouter } from './routes/users/router.js';
import { securityHeaders } from './security-headers.js';

export interface AppOptions {
  /** Folder of the built web app to serve, or null to serve none. */
  webDist: string | null;
  /** Sign-in settings; by default read from the environment (see config.ts). */
  auth?: AuthConfig;
  /** The mail outbox whose sender this process runs (mail/outbox.ts); routes wake it after queueing mail. */
  outbox: Outbox;
  /** The SMTP stand-in's HTTP mailbox to show at /dev/mail; by default MAIL_STANDIN_URL; null: none. */
  mailStandinUrl?: string | null;
  /** The budget of the server's cell checks; by default read from the environment (see config.ts). */
  cellCheck?: CellCheckConfig;
  /** The rate limits; by default read from the environment (see config.ts). */
  rateLimits?: RateLimitConfig;
}

export function createApp({
  webDist,
  auth: settings = authConfig(),
  outbox,
  mailStandinUrl = mailConfig().standinUrl,
  cellCheck,
  rateLimits = rateLimitConfig(),
}: AppOptions): Express {
  if (cellCheck) setCellCheckBudget(cellCheck);
  const app = express();
  app.disable('x-powered-by');
  app.set('trust proxy', settings.trustProxy);
  app.use(securityHeaders());
  const mail: AppMail = { outbox, publicUrl: settings.publicUrl };
  app.locals.mail = mail;
  app.use(csrfCookie({ secret: settings.sessionSecret, secure: secureCookies(settings) }));

  // Health answers without a session, so it works while MariaDB is down.
  app.use('/api/health', healthRouter);

  const auth = createAuth(settings, connect);
  const checkCsrf = csrfCheck(settings.publicUrl, settings.sessionSecret);
  const limits = createLimiters(rateLimits, connect);
  app.use('/auth/github', limits.signIn);
  app.use(['/api', '/auth', '/dev/mail'], auth.session, auth.passport.initialize(), auth.passport.session());
  app.use('/auth/logout', checkCsrf);
  app.use('/auth', authRouter(auth));

  const api = express.Router();
  api.use(limits.writes);
  api.use(['/notebooks', '/users'], limits.reads);
  api.use(checkCsrf);
  // Cell text is capped at 64 KiB by the schemas; the body limit leaves room for JSON escapes.
  api.use(express.json({ limit: '1mb' }));
  api.use('/me/settings', settingsRouter);
  api.use('/me', meRouter);
  api.use('/users', usersRouter);
  api.use('/admin', adminRouter);
  api.use('/notebooks', notebooksRouter);
  api.use(unknownRoute);
  app.use('/api', api);

  if (mailStandinUrl) app.use('/dev/mail', devMailRouter(mailStandinUrl));

  if (webDist && existsSync(path.join(webDist, 'index.html'))) {
    app.use(express.static(webDist, { index: false, maxAge: '1h' }));
    // Client-side routes: anything that is not an API or sign-in call, or a file, gets the app.
    app.get(/^(?!\/(api|auth)\/).*/, (_req, res) => {
      res.sendFile(path.join(webDist, 'index.html'), { maxAge: 0 });
    });
  }

  app.use(errorMiddleware);
  return app;
}
