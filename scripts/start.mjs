// `npm start`: everything a fresh machine needs, then the product on 127.0.0.1.
// Plain Node with no dependencies, so it runs before `npm install`.
import path from 'node:path';
import { ensureMariadbInstalled } from './lib/mariadb.mjs';
import { takeLock } from './lib/lock.mjs';
import { fail, info, ok, runMain, step, warn } from './lib/log.mjs';
import { requireFreePort, waitForPort } from './lib/ports.mjs';
import { apiDist, installAndBuild, migrate, root, seedDemoData, startDatabase } from './lib/prepare.mjs';
import { startService } from './lib/run.mjs';
import { requireMailStandinPorts, startMail } from './lib/mail.mjs';
import { defaultAdminLogins, requireStandinPort, sessionSecret, startSignIn } from './lib/sign-in.mjs';

const apiPort = Number(process.env.API_PORT ?? 4410);
const dbPort = Number(process.env.DB_PORT ?? 3407);
const oauthPort = Number(process.env.OAUTH_STANDIN_PORT ?? 4411);
const smtpPort = Number(process.env.SMTP_STANDIN_PORT ?? 4412);
const mailboxPort = Number(process.env.SMTP_STANDIN_HTTP_PORT ?? 4413);
const publicUrl = process.env.PUBLIC_URL ?? `http://127.0.0.1:${apiPort}`;

await runMain(async () => {
  const release = takeLock(path.join(root, '.data/start.lock'), 'Rolloff (npm start)');
  process.on('exit', release);
  await requireFreePort(apiPort, 'the Rolloff server', 'API_PORT');
  await requireStandinPort(oauthPort, 'OAUTH_STANDIN_PORT');
  await requireMailStandinPorts(smtpPort, mailboxPort, 'SMTP_STANDIN_PORT', 'SMTP_STANDIN_HTTP_PORT');
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
    await seedDemoData(env);

    const signIn = await startSignIn(oauthPort);
    if (signIn.service) {
      services.push(signIn.service);
      signIn.service.exited.then(({ code }) => {
        if (!stopping) {
          warn(`The sign-in stand-in stopped unexpectedly (exit ${code}).`);
          void stopAndExit(1);
        }
      });
    }
    // Kept running by startMail; while it is away the server keeps mail in its outbox.
    const mail = await startMail(smtpPort, mailboxPort);
    if (mail.service) services.push(mail.service);
    Object.assign(env, signIn.env, mail.env, {
      PUBLIC_URL: publicUrl,
      SESSION_SECRET: sessionSecret(),
      ADMIN_LOGINS: process.env.ADMIN_LOGINS ?? defaultAdminLogins,
    });

    step('Starting the server');
    const api = startService('api', process.execPath, [path.join(apiDist, 'cluster.js')], { cwd: root, env });
    services.push(api);
    api.exited.then(({ code }) => {
      if (!stopping) {
        warn(`The server stopped unexpectedly (exit ${code}).`);
        void stopAndExit(1);
      }
    });
    if (!(await waitForPort(apiPort, 20_000))) fail('The server did not start listening within 20 s.');
    ok(`Rolloff is running: open ${publicUrl}/  (Ctrl-C stops it)`);
    if (signIn.service) info('Sign in with the local stand-in: pick one of the demo team, or type a new login.');
    if (mail.service) info(`E-mail goes to the local mail stand-in: read it at ${publicUrl}/dev/mail, signed in as a site admin`);
  } catch (error) {
    await shutdown();
    throw error;
  }
});
