/**
 * Sign-in machinery: the session middleware on the MariaDB store, and a passport instance
 * with the GitHub strategy pointed at real GitHub or at the local stand-in. Each app gets its
 * own passport instance, so tests can run apps with different settings side by side.
 */
import type { RequestHandler } from 'express';
import session from 'express-session';
import passport from 'passport';
import type { PassportStatic } from 'passport';
import { Strategy as GitHubStrategy } from 'passport-github2';
import type { StrategyOptions } from 'passport-github2';
import type { DataSource } from 'typeorm';
import { OAUTH_CALLBACK_PATH, secureCookies } from '../config.js';
import type { AuthConfig } from '../config.js';
import { SESSION_COOKIE } from '../contract/common.js';
import { activeUser, recordSignIn } from '../services/users.js';
import type { GithubIdentity } from '../services/users.js';
import { cookieStateStore } from './oauth-state.js';
import { DatabaseSessionStore } from './session-store.js';
import './types.js';

const sessionTtlMs = 14 * 24 * 3_600_000;

/** A GitHub profile as passport-github2 hands it over. */
interface GithubProfile {
  id: string;
  username?: string;
  displayName?: string;
  emails?: { value: string }[];
}

export interface Auth {
  session: RequestHandler;
  passport: InstanceType<PassportStatic['Authenticator']>;
  /** False when neither the stand-in nor GitHub is configured. */
  signInAvailable: boolean;
}

/** The user object a request carries: only the fields the API reads. */
function sessionUser(user: Express.User): Express.User {
  return { id: user.id, login: user.login, name: user.name, email: user.email, siteRole: user.siteRole, disabled: user.disabled };
}

export function createAuth(config: AuthConfig, database: () => Promise<DataSource>): Auth {
  const authenticator = new passport.Authenticator();

  authenticator.serializeUser((user, done) => done(null, user.id));
  // Every request reloads its user: a disabled or removed user is signed out at once.
  authenticator.deserializeUser((id: unknown, done) => {
    if (typeof id !== 'number') return done(null, false);
    database()
      .then((db) => activeUser(db, id))
      .then((user) => done(null, user ? sessionUser(user) : false), done);
  });

  if (config.oauth) {
    const options = {
      clientID: config.oauth.clientId,
      clientSecret: config.oauth.clientSecret,
      // Relative unless PUBLIC_URL is set: passport resolves it against the request's host.
      callbackURL: `${config.publicUrl ?? ''}${OAUTH_CALLBACK_PATH}`,
      authorizationURL: config.oauth.authorizationURL,
      tokenURL: config.oauth.tokenURL,
      userProfileURL: config.oauth.userProfileURL,
      userEmailURL: config.oauth.userEmailURL,
      scope: ['user:email'],
      userAgent: 'rolloff',
      store: cookieStateStore(secureCookies(config)),
    } as unknown as StrategyOptions;
    const strategy = new GitHubStrategy(
      options,
      (_access: string, _refresh: string, profile: GithubProfile, done: (error: unknown, user?: Express.User | false, info?: { message: string }) => void) => {
        const identity: GithubIdentity = {
          githubId: String(profile.id),
          login: profile.username ?? '',
          name: profile.displayName ?? '',
          email: profile.emails?.[0]?.value ?? null,
        };
        if (!identity.login) return done(null, false, { message: 'no-login' });
        database()
          .then((db) => recordSignIn(db, identity, config.adminLogins))
          .then((result) => {
            if ('refused' in result) done(null, false, { message: result.refused });
            else done(null, sessionUser(result.user));
          }, done);
      },
    );
    // GitHub's authorize page takes `login` to suggest an account; the stand-in signs in as it.
    strategy.authorizationParams = (params: { login?: string }) => (params.login ? { login: params.login } : {});
    authenticator.use('github', strategy);
  }

  const sessionMiddleware = session({
    name: SESSION_COOKIE,
    secret: config.sessionSecret,
    store: new DatabaseSessionStore(database, sessionTtlMs),
    resave: false,
    saveUninitialized: false,
    // Secure follows PUBLIC_URL, not the request; express-session sets a Secure cookie only on a
    // request it sees as https, which behind a proxy needs TRUST_PROXY to name that proxy.
    cookie: { httpOnly: true, sameSite: 'lax', secure: secureCookies(config), maxAge: sessionTtlMs, path: '/' },
  });

  return { session: sessionMiddleware, passport: authenticator, signInAvailable: config.oauth !== null };
}
