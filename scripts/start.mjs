// `npm start`: everything a fresh machine needs, then the product on 127.0.0.1.
// Plain Node with no dependencies, so it runs before `npm install`.
import path from 'node:path';
import { ensureMariadbInstalled } from './lib/mariadb.mjs';
import { takeLock } from './lib/lock.mjs';
import { fail, ok, runMain, step, warn } from './lib/log.mjs';
import { requireFreePort, waitForPort } from './lib/ports.mjs';
import { apiDist, installAndBuild, migrate, root, startDatabase } from './lib/prepare.mjs';
import { mustRun, startService } from './lib/run.mjs';

const apiPort = Number(process.env.API_PORT ?? 4410);
const dbPort = Number(process.env.DB_PORT ?? 3407);

await runMain(async () => {
  const release = takeLock(path.join(root, '.data/start.lock'), 'Rolloff (npm start)');
  process.on('exit', release);
  await requireFreePort(apiPort, 'the Rolloff server', 'API_PORT');
  if (!process.env.DATABASE_URL) await ensureMariadbInstalled();
  await installAndBuild();

  const db = await startDatabase({ dataDir: path.join(root, '.data/mariadb'), port: dbPort, database: 'rolloff' });
  const services = [];
  let stopping = false;
  async function shutdown() {
    if (stopping) return;
    stopping = true;
    step('Stopping');
    for (const service of services.reverse()) await service.stop();
    await db.stop();
    release();
    ok('Stopped cleanly');
  }
  const stopAndExit = (code) => shutdown().finally(() => process.exit(code));
  process.on('SIGINT', () => void stopAndExit(0));
  process.on('SIGTERM', () => void stopAndExit(0));

  try {
    const env = { ...process.env, ...db.env, NODE_ENV: 'production', API_PORT: String(apiPort) };
    await migrate(env);
    step('Loading the demo data (only the first time)');
    await mustRun('Loading the demo data', process.execPath, [path.join(apiDist, 'db/seed-cli.js')], { cwd: root, env });

    step('Starting the server');
    const api = startService('api', process.execPath, [path.join(apiDist, 'server.js')], { cwd: root, env });
    services.push(api);
    api.exited.then(({ code }) => {
      if (!stopping) {
        warn(`The server stopped unexpectedly (exit ${code}).`);
        void stopAndExit(1);
      }
    });
    if (!(await waitForPort(apiPort, 20_000))) fail('The server did not start listening within 20 s.');
    ok(`Rolloff is running: open http://127.0.0.1:${apiPort}/  (Ctrl-C stops it)`);
  } catch (error) {
    await shutdown();
    throw error;
  }
});
