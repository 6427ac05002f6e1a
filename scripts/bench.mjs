// `npm run bench`: the build, then a private server on its own fresh database and ports (the
// same preparation as `npm test`), then every package's benchmark through turbo, one at a
// time so they do not compete for the CPU. The web's benchmark reads BENCH_BASE_URL.
import { rmSync } from 'node:fs';
import path from 'node:path';
import { ensureDebianPackages } from './lib/system.mjs';
import { ensureMariadbInstalled } from './lib/mariadb.mjs';
import { takeLock } from './lib/lock.mjs';
import { fail, runMain, step } from './lib/log.mjs';
import { requireFreePort, waitForPort } from './lib/ports.mjs';
import { apiDist, installAndBuild, migrate, root, seedDemoData, startDatabase } from './lib/prepare.mjs';
import { run, startService, stopAllOnSignal } from './lib/run.mjs';
import { requireMailStandinPorts, startMail } from './lib/mail.mjs';
import { requireStandinPort, startSignIn } from './lib/sign-in.mjs';

const apiPort = Number(process.env.BENCH_API_PORT ?? 4430);
const dbPort = Number(process.env.BENCH_DB_PORT ?? 3430);
const oauthPort = Number(process.env.BENCH_OAUTH_STANDIN_PORT ?? 4431);
const smtpPort = Number(process.env.BENCH_SMTP_STANDIN_PORT ?? 4432);
const mailboxPort = Number(process.env.BENCH_SMTP_STANDIN_HTTP_PORT ?? 4433);

await runMain(async () => {
  const release = takeLock(path.join(root, '.data/bench.lock'), 'Rolloff benchmarks (npm run bench)');
  process.on('exit', release);
  await requireFreePort(apiPort, 'the benchmark server', 'BENCH_API_PORT');
  await requireStandinPort(oauthPort, 'BENCH_OAUTH_STANDIN_PORT');
  // The benchmark's mail never leaves the machine, whatever SMTP_HOST says.
  await requireMailStandinPorts(smtpPort, mailboxPort, 'BENCH_SMTP_STANDIN_PORT', 'BENCH_SMTP_STANDIN_HTTP_PORT', { always: true });
  if (!process.env.DATABASE_URL) await ensureMariadbInstalled();
  await ensureDebianPackages({ chromium: 'chromium' }, 'the web benchmark');
  await installAndBuild();

  const dataDir = path.join(root, '.data/mariadb-bench');
  rmSync(dataDir, { recursive: true, force: true });
  const db = await startDatabase({ dataDir, port: dbPort, database: 'rolloff_bench' });
  const services = [];
  stopAllOnSignal(services, () => db.stop());
  const env = { ...process.env, ...db.env, TURBO_TELEMETRY_DISABLED: '1', TURBO_NO_UPDATE_NOTIFIER: '1', SESSION_SECRET: 'bench-session-secret' };
  try {
    await migrate(env);
    // The demo team signs in; the benchmark makes (and deletes) its own notebooks.
    await seedDemoData(env);
    const signIn = await startSignIn(oauthPort);
    if (signIn.service) services.push(signIn.service);
    const mail = await startMail(smtpPort, mailboxPort, { always: true });
    services.push(mail.service);
    step(`Starting the benchmark server on 127.0.0.1:${apiPort}`);
    const api = startService('api', process.execPath, [path.join(apiDist, 'server.js')], {
      cwd: root,
      env: { ...env, ...signIn.env, ...mail.env, NODE_ENV: 'production', API_PORT: String(apiPort), PUBLIC_URL: `http://127.0.0.1:${apiPort}` },
    });
    services.push(api);
    if (!(await waitForPort(apiPort, 20_000))) fail('The benchmark server did not start listening within 20 s.');

    step('Benchmarks (turbo run bench)');
    const code = await run('npx', ['turbo', 'run', 'bench', '--concurrency=1', '--continue', '--output-logs=full'], {
      cwd: root,
      env: { ...env, BENCH_BASE_URL: `http://127.0.0.1:${apiPort}` },
    });
    if (code !== 0) process.exitCode = code;
  } finally {
    for (const service of services.reverse()) await service.stop();
    await db.stop();
  }
});
