// What both `npm start` and `npm test` do first: packages, build, database, migrations.
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensureNodeModules } from './system.mjs';
import { startPrivateMariadb } from './mariadb.mjs';
import { mustRun } from './run.mjs';
import { info, step } from './log.mjs';

export const root = path.resolve(fileURLToPath(new URL('../..', import.meta.url)));
export const apiDist = path.join(root, 'packages/api/dist');

/** npm packages (npm ci when missing or stale), then a turbo build of every package and the `rolloff` command. */
export async function installAndBuild() {
  await ensureNodeModules(root);
  step('Building (turbo run build)');
  await mustRun('The build', 'npx', ['turbo', 'run', 'build', '--output-logs=errors-only'], {
    cwd: root,
    env: { ...process.env, TURBO_TELEMETRY_DISABLED: '1', TURBO_NO_UPDATE_NOTIFIER: '1' },
  });
  // npm links a workspace's command only if its file exists at install time, which a fresh
  // clone's first install precedes: link `rolloff` now that the solver is built.
  if (!existsSync(path.join(root, 'node_modules/.bin/rolloff'))) {
    await mustRun('Linking the rolloff command', 'npm', ['rebuild', '@rolloff/solver', '--ignore-scripts'], { cwd: root });
  }
}

/**
 * Starts the private MariaDB (unless DATABASE_URL names a server) and returns the
 * environment the API processes need, plus a stop function.
 */
export async function startDatabase({ dataDir, port, database }) {
  if (process.env.DATABASE_URL) {
    info('Using the MariaDB server in DATABASE_URL (no private server started)');
    return { env: { DATABASE_URL: process.env.DATABASE_URL }, stop: async () => {} };
  }
  const user = 'rolloff';
  const password = process.env.DB_PASSWORD ?? 'rolloff-local';
  const db = await startPrivateMariadb({ dataDir, port, database, user, password });
  return {
    env: { DB_HOST: '127.0.0.1', DB_PORT: String(port), DB_USER: user, DB_PASSWORD: password, DB_NAME: database, DATABASE_URL: '' },
    stop: db.stop,
  };
}

/** Applies pending migrations with the built API. */
export async function migrate(env) {
  step('Migrating the database');
  await mustRun('The migrations', process.execPath, [path.join(apiDist, 'db/migrate.js')], { cwd: root, env: { ...process.env, ...env } });
}

/** Loads the demo data with the built API (only the first time for a database). */
export async function seedDemoData(env) {
  step('Loading the demo data (only the first time)');
  await mustRun('Loading the demo data', process.execPath, [path.join(apiDist, 'seed/cli.js')], { cwd: root, env: { ...process.env, ...env } });
}
