// Sign-in for the start and test commands: the session secret, and the local OAuth stand-in
// for GitHub (its own process on loopback) unless real GitHub is configured.
import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fail, info, step } from './log.mjs';
import { requireFreePort, waitForPort } from './ports.mjs';
import { apiDist, root } from './prepare.mjs';
import { startService } from './run.mjs';

/** The demo admin, made a site admin at sign-in unless ADMIN_LOGINS says otherwise. */
export const defaultAdminLogins = 'mara.lindqvist';

/**
 * SESSION_SECRET if set, else this installation's own random secret, made on first use and
 * kept in .data/session-secret so sessions survive a restart.
 */
export function sessionSecret() {
  if (process.env.SESSION_SECRET) return process.env.SESSION_SECRET;
  const file = path.join(root, '.data/session-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(path.dirname(file), { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(file, `${secret}\n`, { mode: 0o600 });
  return secret;
}

/** Real GitHub when its client is configured and no stand-in address is given. */
function usesGithub() {
  return Boolean(process.env.GITHUB_CLIENT_ID && process.env.GITHUB_CLIENT_SECRET && !process.env.OAUTH_BASE_URL);
}

/** Whether this run starts its own stand-in (no GitHub client, no OAUTH_BASE_URL given). */
export function startsStandin() {
  return !usesGithub() && !process.env.OAUTH_BASE_URL;
}

/** Fails early, naming the variable, when the stand-in's port is taken. */
export async function requireStandinPort(port, variable) {
  if (startsStandin()) await requireFreePort(port, 'the sign-in stand-in', variable);
}

/**
 * Starts the stand-in on 127.0.0.1:port when this run needs one, and returns it (or null)
 * with the environment that points the API at the sign-in in use.
 */
export async function startSignIn(port) {
  if (usesGithub()) {
    info('Sign-in with GitHub (GITHUB_CLIENT_ID is set)');
    return { service: null, env: {} };
  }
  if (process.env.OAUTH_BASE_URL) {
    info(`Sign-in through the stand-in at ${process.env.OAUTH_BASE_URL}`);
    return { service: null, env: { OAUTH_BASE_URL: process.env.OAUTH_BASE_URL } };
  }
  step(`Starting the sign-in stand-in on 127.0.0.1:${port}`);
  const service = startService('sign-in stand-in', process.execPath, [path.join(apiDist, 'standins/oauth/server.js')], {
    cwd: root,
    env: { ...process.env, OAUTH_STANDIN_PORT: String(port) },
  });
  let exited = false;
  service.exited.then(() => {
    exited = true;
  });
  if (!(await waitForPort(port, 10_000)) || exited) {
    await service.stop();
    fail(`The sign-in stand-in did not start on port ${port}.`);
  }
  return { service, env: { OAUTH_BASE_URL: `http://127.0.0.1:${port}` } };
}
