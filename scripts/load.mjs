// `npm run load`: the build, then a private server on its own fresh database and ports, then
// autocannon against it: reading a notebook and saving a cell at 10, 100 and 200 concurrent
// clients, for each server process count in LOAD_WORKERS (default 1 and 2). Prints p50, p95,
// p99 and throughput, and the lost-write count (saves answered 2xx but not stored), which
// must be 0; exits 1 otherwise. The figures go in packages/api/BENCHMARKS.md by hand.
import { rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { ensureMariadbInstalled } from './lib/mariadb.mjs';
import { takeLock } from './lib/lock.mjs';
import { fail, info, ok, runMain, step, warn } from './lib/log.mjs';
import { requireFreePort, waitForPort } from './lib/ports.mjs';
import { apiDist, installAndBuild, migrate, root, seedDemoData, startDatabase } from './lib/prepare.mjs';
import { startService, stopAllOnSignal } from './lib/run.mjs';
import { requireMailStandinPorts, startMail } from './lib/mail.mjs';
import { requireStandinPort, startSignIn } from './lib/sign-in.mjs';

const apiPort = Number(process.env.LOAD_API_PORT ?? 4436);
const dbPort = Number(process.env.LOAD_DB_PORT ?? 3436);
const oauthPort = Number(process.env.LOAD_OAUTH_STANDIN_PORT ?? 4437);
const smtpPort = Number(process.env.LOAD_SMTP_STANDIN_PORT ?? 4438);
const mailboxPort = Number(process.env.LOAD_SMTP_STANDIN_HTTP_PORT ?? 4439);
const workerCounts = (process.env.LOAD_WORKERS ?? '1,2').split(',').map((n) => Number(n.trim()));
const concurrencies = (process.env.LOAD_CONNECTIONS ?? '10,100,200').split(',').map((n) => Number(n.trim()));
const seconds = Number(process.env.LOAD_SECONDS ?? 10);
/** The demo team signs in; the writers' cells are spread over their notebooks. */
const logins = ['mara.lindqvist', 'tobias.okafor', 'ines.carvalho', 'kenji.arai'];

/**
 * The rate limits, raised far past what the load sends but still counted, so the figures
 * include the work of the shared limit store (every client here is one loopback address).
 */
const raisedRateLimits = Object.fromEntries(
  ['RATE_LIMIT_SIGN_IN', 'RATE_LIMIT_WRITES', 'RATE_LIMIT_WRITES_PER_ADDRESS', 'RATE_LIMIT_READS', 'RATE_LIMIT_READS_PER_ADDRESS'].map((name) => [
    name,
    '100000000',
  ]),
);

const loadTitle = 'Load run,';
const ms = (value) => (Number.isFinite(value) ? value.toFixed(1) : '—');

await runMain(async () => {
  if (workerCounts.some((n) => !Number.isInteger(n) || n < 1)) fail('LOAD_WORKERS must list whole numbers of processes from 1, e.g. 1,2.');
  if (concurrencies.some((n) => !Number.isInteger(n) || n < 1)) fail('LOAD_CONNECTIONS must list whole numbers of clients from 1, e.g. 10,100,200.');
  const release = takeLock(path.join(root, '.data/load.lock'), 'Rolloff load run (npm run load)');
  process.on('exit', release);
  await requireFreePort(apiPort, 'the load server', 'LOAD_API_PORT');
  await requireStandinPort(oauthPort, 'LOAD_OAUTH_STANDIN_PORT');
  await requireMailStandinPorts(smtpPort, mailboxPort, 'LOAD_SMTP_STANDIN_PORT', 'LOAD_SMTP_STANDIN_HTTP_PORT', { always: true });
  if (!process.env.DATABASE_URL) await ensureMariadbInstalled();
  await installAndBuild();
  const { checkSaves, readLoad, saveLoad } = await import('./lib/load-runs.mjs');
  const { signedIn } = await import('./lib/web-session.mjs');

  const dataDir = path.join(root, '.data/mariadb-load');
  rmSync(dataDir, { recursive: true, force: true });
  const db = await startDatabase({ dataDir, port: dbPort, database: 'rolloff_load' });
  const services = [];
  stopAllOnSignal(services, () => db.stop());
  const env = { ...process.env, ...db.env, SESSION_SECRET: 'load-session-secret' };
  const loadBefore = os.loadavg();
  const rows = [];
  let lostTotal = 0;
  let readTarget = '';
  try {
    await migrate(env);
    await seedDemoData(env);
    const signIn = await startSignIn(oauthPort);
    if (signIn.service) services.push(signIn.service);
    const mail = await startMail(smtpPort, mailboxPort, { always: true });
    services.push(mail.service);
    const url = `http://127.0.0.1:${apiPort}`;

    for (const workers of workerCounts) {
      step(`Starting the server as ${workers} process${workers === 1 ? '' : 'es'} on 127.0.0.1:${apiPort}`);
      const api = startService('api', process.execPath, [path.join(apiDist, 'cluster.js')], {
        cwd: root,
        env: {
          ...env,
          ...signIn.env,
          ...mail.env,
          ...raisedRateLimits,
          NODE_ENV: 'production',
          API_PORT: String(apiPort),
          PUBLIC_URL: url,
          API_WORKERS: String(workers),
        },
        stdio: ['ignore', 'ignore', 'inherit'],
      });
      try {
        if (!(await waitForPort(apiPort, 20_000))) fail('The load server did not start listening within 20 s.');
        const sessions = [];
        for (const login of logins) sessions.push(await signedIn(url, login));
        const [reader] = sessions;
        // The largest of the demo notebooks (not one this run made for its writers).
        const { items } = await reader.json('GET', '/api/notebooks');
        const demo = items.filter((item) => !item.title.startsWith(loadTitle)).sort((a, b) => b.cellCount - a.cellCount);
        const notebook = demo[0] ?? fail('The demo data has no notebook to read.');
        readTarget = `"${notebook.title}", ${notebook.cellCount} cells`;

        for (const connections of concurrencies) {
          info(`reading a notebook, ${connections} clients, ${seconds} s`);
          const reads = await readLoad({ url, session: reader, notebookId: notebook.id, connections, seconds });
          rows.push({ workers, what: 'read a notebook', connections, ...reads });

          // Each writer its own new cell, the cells spread over one new notebook per person.
          const writers = [];
          for (const [index, session] of sessions.entries()) {
            const count = Math.ceil((connections - index) / sessions.length);
            if (count <= 0) continue;
            const cells = Array.from({ length: count }, (_, i) => ({
              kind: 'circuit',
              text: `drive in\nR1 [in out] 1k\nC1 [out gnd] 100n\nshow out\n# cell ${i}\n`,
            }));
            const made = await session.json('POST', '/api/notebooks', { title: `${loadTitle} ${connections} writers`, cells });
            for (const cell of made.cells) writers.push({ url, session, notebookId: made.id, cellId: cell.id });
          }
          info(`saving a cell, ${connections} clients, ${seconds} s`);
          const saves = await saveLoad({ writers, seconds });
          const outcome = await checkSaves(env, saves.writers);
          lostTotal += outcome.lost + outcome.doubled + outcome.countMismatch;
          rows.push({ workers, what: 'save a cell', connections, ...saves.timing, ...outcome });
        }
      } finally {
        await api.stop();
      }
    }
  } finally {
    for (const service of services.reverse()) await service.stop();
    await db.stop();
  }

  const load = (averages) => averages.map((n) => n.toFixed(2)).join(', ');
  console.log('');
  console.log(
    `${os.availableParallelism()} cores; load average (1, 5, 15 min) ${load(loadBefore)} at the start, ${load(os.loadavg())} at the end; ${seconds} s per run; autocannon on the same machine`,
  );
  console.log('');
  console.log('| API_WORKERS | request | clients | answered 2xx | per second | p50 ms | p95 ms | p99 ms | non-2xx | errors | saves lost | stored twice |');
  console.log('|---|---|---|---|---|---|---|---|---|---|---|---|');
  for (const r of rows) {
    const saves = r.what === 'save a cell' ? [`${r.lost}`, `${r.doubled}`] : ['', ''];
    console.log(
      `| ${r.workers} | ${r.what} | ${r.connections} | ${r.ok} | ${r.perSecond.toFixed(0)} | ${ms(r.p50)} | ${ms(r.p95)} | ${ms(r.p99)} | ${
        Object.entries(r.refused)
          .map(([status, n]) => `${n}× ${status}`)
          .join(', ') || 0
      } | ${r.errors + r.timeouts} | ${saves.join(' | ')} |`,
    );
  }
  for (const r of rows.filter((row) => row.what === 'save a cell' && (row.unanswered || row.countMismatch))) {
    info(
      `API_WORKERS=${r.workers}, ${r.connections} writers: ${r.unanswered} saves stored whose answer was cut off; ${r.countMismatch} cells whose revision count is off`,
    );
  }
  info(`The notebook read: ${readTarget}.`);
  for (const goal of rows.filter((r) => r.what === 'read a notebook' && r.connections === 100)) {
    info(`Goal, notebook read p95 under 100 ms at 100 readers, API_WORKERS=${goal.workers}: ${goal.p95 < 100 ? 'met' : 'not met'} (${ms(goal.p95)} ms).`);
  }
  if (lostTotal > 0) {
    warn(`${lostTotal} saves were lost, stored twice, or left a cell's revision count off: see the table.`);
    process.exitCode = 1;
  } else {
    ok('No save was lost or stored twice.');
  }
});
