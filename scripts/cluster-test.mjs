// `npm run cluster:test`: three MariaDB Galera nodes on loopback (data under .data/galera-*),
// migrations once, two server processes on different nodes, and concurrent writers saving
// cells of the same notebooks through both servers while people are added to those notebooks
// (each addition sends one e-mail). Then it checks, on the third node, that no save answered
// 2xx was lost or stored twice, and in the mail stand-in that each e-mail went out exactly
// once. Stops everything; exits 1 when a check fails.
import path from 'node:path';
import { takeLock } from './lib/lock.mjs';
import { fail, info, ok, runMain, step, warn } from './lib/log.mjs';
import { requireFreePort, waitForPort } from './lib/ports.mjs';
import { apiDist, installAndBuild, migrate, root, seedDemoData } from './lib/prepare.mjs';
import { startService, stopAllOnSignal } from './lib/run.mjs';
import { requireMailStandinPorts, startMail } from './lib/mail.mjs';
import { requireStandinPort, startSignIn } from './lib/sign-in.mjs';
import { startGaleraCluster } from './lib/galera.mjs';

/** Node N (1–3) listens for SQL on 3460+N, group communication on 4560+N, IST on 4570+N, SST on 4580+N. */
const sqlBase = Number(process.env.CLUSTER_DB_PORT_BASE ?? 3460);
const groupBase = Number(process.env.CLUSTER_PORT_BASE ?? 4560);
const galeraPorts = [1, 2, 3].map((n) => ({ sql: sqlBase + n, group: groupBase + n, ist: groupBase + 10 + n, sst: groupBase + 20 + n }));
const apiPorts = [Number(process.env.CLUSTER_API_PORT ?? 4466), Number(process.env.CLUSTER_API_PORT ?? 4466) + 1];
const oauthPort = Number(process.env.CLUSTER_OAUTH_STANDIN_PORT ?? 4468);
const smtpPort = Number(process.env.CLUSTER_SMTP_STANDIN_PORT ?? 4464);
const mailboxPort = Number(process.env.CLUSTER_SMTP_STANDIN_HTTP_PORT ?? 4465);
const seconds = Number(process.env.CLUSTER_SECONDS ?? 15);
/** Writers per server; all of them save cells of the same two notebooks. */
const writersPerServer = Number(process.env.CLUSTER_WRITERS ?? 20);
const owners = ['mara.lindqvist', 'tobias.okafor'];
const invitees = ['ines.carvalho', 'kenji.arai', 'priya.venkat'];

await runMain(async () => {
  const release = takeLock(path.join(root, '.data/cluster-test.lock'), 'Rolloff cluster test (npm run cluster:test)');
  process.on('exit', release);
  for (const [i, port] of apiPorts.entries()) await requireFreePort(port, `cluster test server ${i + 1}`, 'CLUSTER_API_PORT');
  await requireStandinPort(oauthPort, 'CLUSTER_OAUTH_STANDIN_PORT');
  await requireMailStandinPorts(smtpPort, mailboxPort, 'CLUSTER_SMTP_STANDIN_PORT', 'CLUSTER_SMTP_STANDIN_HTTP_PORT', { always: true });
  await installAndBuild();
  const { checkSaves, openDatabase, saveLoad } = await import('./lib/load-runs.mjs');
  const { signedIn } = await import('./lib/web-session.mjs');

  const cluster = await startGaleraCluster({
    baseDir: path.join(root, '.data'),
    ports: galeraPorts,
    database: 'rolloff_cluster',
    user: 'rolloff',
    password: process.env.DB_PASSWORD ?? 'rolloff-local',
  });
  const services = [];
  stopAllOnSignal(services, () => cluster.stop());
  const [first, second, third] = cluster.nodes;
  const base = { ...process.env, SESSION_SECRET: 'cluster-session-secret' };
  let failures = 0;
  try {
    await migrate({ ...base, ...first.env });
    await seedDemoData({ ...base, ...first.env });
    const signIn = await startSignIn(oauthPort);
    if (signIn.service) services.push(signIn.service);
    const mail = await startMail(smtpPort, mailboxPort, { always: true });
    services.push(mail.service);

    // Server 1 on node 1, server 2 on node 2; node 3 is where the results are read.
    const urls = apiPorts.map((port) => `http://127.0.0.1:${port}`);
    for (const [i, node] of [first, second].entries()) {
      step(`Starting server ${i + 1} on 127.0.0.1:${apiPorts[i]}, on ${node.name}`);
      const api = startService(`api ${i + 1}`, process.execPath, [path.join(apiDist, 'server.js')], {
        cwd: root,
        env: {
          ...base,
          ...node.env,
          ...signIn.env,
          ...mail.env,
          NODE_ENV: 'production',
          API_PORT: String(apiPorts[i]),
          PUBLIC_URL: urls[i],
          MAIL_POLL_MS: '500',
          RATE_LIMIT_WRITES: '100000000',
          RATE_LIMIT_WRITES_PER_ADDRESS: '100000000',
          RATE_LIMIT_SIGN_IN: '100000000',
        },
        stdio: ['ignore', 'ignore', 'inherit'],
      });
      services.push(api);
      if (!(await waitForPort(apiPorts[i], 30_000))) fail(`Server ${i + 1} did not start listening within 30 s.`);
    }

    // Each owner signs in on both servers; their notebook's cells are split between them.
    const writers = [];
    const notebooks = [];
    const sessionsOf = {};
    for (const login of owners) {
      sessionsOf[login] = [];
      for (const url of urls) sessionsOf[login].push(await signedIn(url, login));
      const cells = Array.from({ length: writersPerServer }, (_, i) => ({
        kind: 'circuit',
        text: `drive in\nR1 [in out] 1k\nC1 [out gnd] 100n\nshow out\n# cell ${i}\n`,
      }));
      const made = await sessionsOf[login][0].json('POST', '/api/notebooks', { title: `Cluster test (${login}) ${Date.now()}`, cells });
      notebooks.push({ ...made, login });
      for (const [i, cell] of made.cells.entries()) {
        const server = i % 2;
        writers.push({ url: urls[server], session: sessionsOf[login][server], notebookId: made.id, cellId: cell.id });
      }
    }

    // Meanwhile each owner adds the others to their notebook, alternating servers: one e-mail each.
    const db = await openDatabase(third.env);
    const [people] = await db.query('SELECT id, login, email FROM users WHERE login IN (?)', [invitees]);
    await db.end();
    const expectedMail = [];
    let additionRetries = 0;
    const additions = async () => {
      let turn = 0;
      for (const notebook of notebooks) {
        for (const person of people) {
          const session = sessionsOf[notebook.login][turn++ % 2];
          // As a person would, try again after an error; adding someone twice sends one e-mail.
          for (let attempt = 1; ; attempt++) {
            try {
              await session.json('PUT', `/api/notebooks/${notebook.id}/members/${person.id}`, { role: 'viewer' });
              break;
            } catch (error) {
              if (attempt === 5) throw error;
              additionRetries += 1;
            }
          }
          expectedMail.push({ to: person.email, title: notebook.title });
        }
      }
    };

    step(`${writers.length} writers through both servers for ${seconds} s, while people are added to the notebooks`);
    const [saves] = await Promise.all([saveLoad({ writers, seconds }), additions()]);
    const outcome = await checkSaves(third.env, saves.writers);
    info(
      `${saves.timing.ok} saves answered 2xx (${saves.timing.perSecond.toFixed(0)}/s, p50 ${saves.timing.p50.toFixed(0)} ms, p95 ${saves.timing.p95.toFixed(0)} ms); ` +
        `other answers: ${JSON.stringify(saves.timing.refused)}, ${saves.timing.errors + saves.timing.timeouts} errors`,
    );
    info(
      `read on ${third.name}: ${outcome.acknowledged} answered saves, ${outcome.lost} lost, ${outcome.doubled} stored twice, ${outcome.unanswered} stored whose answer was cut off`,
    );
    if (outcome.lost || outcome.doubled || outcome.countMismatch) {
      warn(`Saves lost or doubled: ${outcome.lost} lost, ${outcome.doubled} doubled, ${outcome.countMismatch} cells with a revision count off.`);
      failures += 1;
    }
    if (outcome.acknowledged === 0) {
      warn('No save was answered 2xx, so nothing was shown.');
      failures += 1;
    }

    // Mail: wait until the outbox (read on node 3) is empty, then count what arrived.
    const deadline = Date.now() + 60_000;
    for (;;) {
      const check = await openDatabase(third.env);
      const [[{ waiting }]] = await check.query('SELECT COUNT(*) AS waiting FROM mail_outbox');
      await check.end();
      if (Number(waiting) === 0) break;
      if (Date.now() > deadline) fail(`${waiting} e-mails still wait in the outbox after 60 s.`);
      await new Promise((r) => setTimeout(r, 500));
    }
    const { messages } = await (await fetch(`${mail.env.MAIL_STANDIN_URL}/messages`)).json();
    let mailWrong = 0;
    for (const expected of expectedMail) {
      const copies = messages.filter((m) => m.to.some((to) => to.includes(expected.to)) && m.subject.includes(expected.title)).length;
      if (copies !== 1) {
        warn(`The e-mail to ${expected.to} about "${expected.title}" arrived ${copies} times.`);
        mailWrong += 1;
      }
    }
    // Nothing else may arrive twice either (the demo data queues no mail, but whatever does).
    const seen = new Map();
    for (const m of messages) {
      const key = `${m.to.join()}|${m.subject}|${m.text}`;
      seen.set(key, (seen.get(key) ?? 0) + 1);
    }
    const twice = [...seen.values()].filter((count) => count > 1).length;
    if (additionRetries) info(`${additionRetries} additions of a person were answered with an error and tried again`);
    info(
      `${expectedMail.length} e-mails expected, ${messages.length} in the mailbox; ${mailWrong} expected ones not there exactly once, ${twice} messages there twice`,
    );
    if (mailWrong || twice) failures += 1;

    for (const node of cluster.status()) {
      info(
        `${node.name}: ${node.wsrep_local_state_comment}, cluster size ${node.wsrep_cluster_size}, ${node.wsrep_local_cert_failures} certification failures, ${node.wsrep_local_bf_aborts} aborted by replication`,
      );
    }
  } finally {
    for (const service of services.reverse()) await service.stop();
    await cluster.stop();
  }
  if (failures) fail(`The cluster test found ${failures} problem(s); see above.`);
  ok('Nothing lost or doubled across the cluster, and each e-mail went out once.');
});
