// `npm test`: the same preparation as `npm start` against a separate, fresh test database,
// then every package's unit tests, the API's tests on MariaDB, and the end-to-end suite in
// headless Chromium. Prints one line per suite and a last line `N passed, N failed`.
import { existsSync, mkdirSync, readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { ensureDebianPackages } from './lib/system.mjs';
import { ensureMariadbInstalled } from './lib/mariadb.mjs';
import { takeLock } from './lib/lock.mjs';
import { fail, info, runMain, step } from './lib/log.mjs';
import { requireFreePort, waitForPort } from './lib/ports.mjs';
import { checkFormatting } from './lib/format-check.mjs';
import { apiDist, installAndBuild, migrate, root, seedDemoData, startDatabase } from './lib/prepare.mjs';
import { run, startService, stopAllOnSignal } from './lib/run.mjs';
import { requireMailStandinPorts, startMail } from './lib/mail.mjs';
import { defaultAdminLogins, requireStandinPort, startSignIn } from './lib/sign-in.mjs';

const apiPort = Number(process.env.TEST_API_PORT ?? 4420);
const dbPort = Number(process.env.TEST_DB_PORT ?? 3417);
const oauthPort = Number(process.env.TEST_OAUTH_STANDIN_PORT ?? 4421);
const smtpPort = Number(process.env.TEST_SMTP_STANDIN_PORT ?? 4422);
const mailboxPort = Number(process.env.TEST_SMTP_STANDIN_HTTP_PORT ?? 4423);
const resultsDir = path.join(root, '.test-results');
const suites = [
  { name: 'solver', file: 'solver.json' },
  { name: 'api', file: 'api.json' },
  { name: 'web', file: 'web.json' },
  { name: 'e2e', file: 'e2e.json' },
];

/** Reads a Vitest JSON report; a missing report means the suite did not run to the end. */
function countsOf(file) {
  const report = path.join(resultsDir, file);
  if (!existsSync(report)) return null;
  const json = JSON.parse(readFileSync(report, 'utf8'));
  // A file that failed to load counts as a failure even though it ran no test.
  const brokenFiles = (json.testResults ?? []).filter((r) => r.status === 'failed' && (r.assertionResults ?? []).length === 0).length;
  return { passed: json.numPassedTests, failed: json.numFailedTests + brokenFiles, skipped: json.numPendingTests + json.numTodoTests };
}

await runMain(async () => {
  const release = takeLock(path.join(root, '.data/test.lock'), 'Rolloff tests (npm test)');
  process.on('exit', release);
  await requireFreePort(apiPort, 'the test server', 'TEST_API_PORT');
  await requireStandinPort(oauthPort, 'TEST_OAUTH_STANDIN_PORT');
  // The end-to-end tests read what was sent, so `npm test` always runs its own mail stand-in.
  await requireMailStandinPorts(smtpPort, mailboxPort, 'TEST_SMTP_STANDIN_PORT', 'TEST_SMTP_STANDIN_HTTP_PORT', { always: true });
  if (!process.env.DATABASE_URL) await ensureMariadbInstalled();
  await ensureDebianPackages({ chromium: 'chromium' }, 'the end-to-end tests');
  await installAndBuild();
  step('Formatting (the same check as npm run lint)');
  const formatting = await checkFormatting(root);
  for (const file of formatting.unformatted) info(`not formatted: ${file} (npm run format fixes it)`);

  // A fresh test database every run, so results never depend on an earlier run.
  const dataDir = path.join(root, '.data/mariadb-test');
  rmSync(dataDir, { recursive: true, force: true });
  rmSync(resultsDir, { recursive: true, force: true });
  mkdirSync(resultsDir, { recursive: true });
  const db = await startDatabase({ dataDir, port: dbPort, database: 'rolloff_test' });
  const services = [];
  // Ctrl-C: stop what this run started (the stand-in, the server, MariaDB) before leaving.
  stopAllOnSignal(services, () => db.stop());
  const env = {
    ...process.env,
    ...db.env,
    TEST_RESULTS_DIR: resultsDir,
    TURBO_TELEMETRY_DISABLED: '1',
    TURBO_NO_UPDATE_NOTIFIER: '1',
    SESSION_SECRET: 'test-session-secret',
  };
  try {
    await migrate(env);
    // The same demo data as `npm start`, so the end-to-end tests can sign in as the demo team.
    await seedDemoData(env);

    step('Unit and API tests (turbo run test)');
    await run('npx', ['turbo', 'run', 'test', '--concurrency=1', '--continue', '--output-logs=full'], { cwd: root, env });

    step('End-to-end tests in headless Chromium');
    const signIn = await startSignIn(oauthPort);
    if (signIn.service) services.push(signIn.service);
    const mail = await startMail(smtpPort, mailboxPort, { always: true });
    services.push(mail.service);
    const serverEnv = {
      ...env,
      ...signIn.env,
      ...mail.env,
      NODE_ENV: 'production',
      API_PORT: String(apiPort),
      PUBLIC_URL: `http://127.0.0.1:${apiPort}`,
      ADMIN_LOGINS: process.env.ADMIN_LOGINS ?? defaultAdminLogins,
    };
    const api = startService('api', process.execPath, [path.join(apiDist, 'server.js')], { cwd: root, env: serverEnv });
    services.push(api);
    if (!(await waitForPort(apiPort, 20_000))) fail('The test server did not start listening within 20 s.');
    await run('npx', ['vitest', 'run', '--config', 'vitest.e2e.config.ts'], {
      cwd: path.join(root, 'packages/web'),
      env: {
        ...env,
        ...signIn.env,
        E2E_BASE_URL: `http://127.0.0.1:${apiPort}`,
        MAIL_STANDIN_URL: mail.env.MAIL_STANDIN_URL,
        SCREENSHOT_DIR: path.join(root, 'test-output/screenshots'),
      },
    });
  } finally {
    for (const service of services.reverse()) await service.stop();
    await db.stop();
  }

  console.log('');
  console.log(`format: ${formatting.passed} passed, ${formatting.failed} failed`);
  let passed = formatting.passed;
  let failed = formatting.failed;
  for (const suite of suites) {
    const counts = countsOf(suite.file);
    if (!counts) {
      console.log(`${suite.name}: did not report (counted as 1 failed)`);
      failed += 1;
      continue;
    }
    if (counts.passed + counts.failed === 0) {
      console.log(`${suite.name}: ran no test (counted as 1 failed)`);
      failed += 1;
      continue;
    }
    console.log(`${suite.name}: ${counts.passed} passed, ${counts.failed} failed`);
    passed += counts.passed;
    failed += counts.failed;
  }
  info(`screenshots in ${path.relative(root, path.join(root, 'test-output/screenshots'))}/`);
  console.log(`${passed} passed, ${failed} failed`);
  if (failed > 0) process.exitCode = 1;
});
