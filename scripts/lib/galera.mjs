// A MariaDB Galera cluster on loopback for `npm run cluster:test`: each node its own data
// folder, SQL port and group-communication ports; the first bootstraps the cluster, the others
// join it and receive its data by rsync (a state snapshot transfer).
import { existsSync, mkdirSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { spawnSync } from 'node:child_process';
import { fail, info, step } from './log.mjs';
import { requireFreePort } from './ports.mjs';
import { SERVER_CANDIDATES, client, ensureMariadbInstalled, findBinary, socketPath, tail } from './mariadb.mjs';
import { startService } from './run.mjs';

/** Debian's galera-4 package. */
export const galeraProvider = '/usr/lib/galera/libgalera_smm.so';

/**
 * The account the nodes run as. Not root: a joining node receives its data through an rsync
 * daemon, which as root drops to `nobody` and then may not write the data folder. Root runs
 * them as Debian's `mysql` account instead; anyone else as themselves.
 */
function nodeAccount() {
  if (process.getuid?.() !== 0) return os.userInfo().username;
  if (spawnSync('id', ['mysql'], { stdio: 'ignore' }).status !== 0)
    fail('The cluster test runs MariaDB as the mysql account when started as root, and there is none.');
  return 'mysql';
}

/** One node's status variables (wsrep_*), read over its socket as root. */
function wsrepStatus(socket) {
  const result = spawnSync('mariadb', ['--no-defaults', `--socket=${socket}`, '-uroot', '-N', '-B', '-e', "SHOW GLOBAL STATUS LIKE 'wsrep_%'"], {
    encoding: 'utf8',
  });
  if (result.status !== 0) return null;
  return Object.fromEntries(
    result.stdout
      .trim()
      .split('\n')
      .map((line) => line.split('\t')),
  );
}

/**
 * Starts `ports.length` nodes (ports: { sql, group, ist, sst } each) with fresh data under
 * `baseDir`/galera-N, creates `database` and its user once, and returns their DB_* settings
 * per node and a stop function that stops them last-joined first.
 */
export async function startGaleraCluster({ baseDir, ports, database, user, password }) {
  await ensureMariadbInstalled();
  if (!existsSync(galeraProvider)) fail(`The cluster test needs Galera (${galeraProvider}): apt-get install galera-4.`);
  for (const [i, p] of ports.entries()) {
    for (const [port, what, variable] of [
      [p.sql, 'SQL', 'CLUSTER_DB_PORT_BASE'],
      [p.group, 'group communication', 'CLUSTER_PORT_BASE'],
      [p.ist, 'incremental state transfer', 'CLUSTER_PORT_BASE'],
      [p.sst, 'state snapshot transfer', 'CLUSTER_PORT_BASE'],
    ]) {
      await requireFreePort(port, `Galera node ${i + 1}'s ${what}`, variable);
    }
  }
  const server = findBinary(SERVER_CANDIDATES);
  const installDb = findBinary(['mariadb-install-db', 'mysql_install_db']);
  const account = nodeAccount();
  const members = ports.map((p) => `127.0.0.1:${p.group}`).join(',');
  const nodes = [];

  async function stop() {
    for (const node of [...nodes].reverse()) {
      const down = spawnSync('mariadb-admin', ['--no-defaults', `--socket=${node.socket}`, '-uroot', 'shutdown'], { encoding: 'utf8' });
      if (down.status !== 0) await node.service.stop();
      const timer = setTimeout(() => node.service.stop(), 30_000);
      await node.service.exited;
      clearTimeout(timer);
    }
  }

  try {
    for (const [i, p] of ports.entries()) {
      const name = `galera-${i + 1}`;
      const dataDir = path.join(baseDir, name);
      rmSync(dataDir, { recursive: true, force: true });
      const files = path.join(dataDir, 'files');
      mkdirSync(dataDir, { recursive: true });
      const made = spawnSync(
        installDb,
        ['--no-defaults', `--datadir=${files}`, `--user=${account}`, '--auth-root-authentication-method=normal', '--skip-test-db'],
        {
          encoding: 'utf8',
        },
      );
      if (made.status !== 0) fail(`mariadb-install-db failed for ${name}:\n${made.stderr || made.stdout}`);
      // The node writes its socket, log and process id beside its data.
      if (account !== os.userInfo().username) spawnSync('chown', ['-R', `${account}:`, dataDir]);
      const socket = socketPath(dataDir);
      const errorLog = path.join(dataDir, 'error.log');
      const bootstrap = i === 0;
      step(`${bootstrap ? 'Bootstrapping the cluster with' : 'Joining'} Galera node ${i + 1} (SQL on 127.0.0.1:${p.sql}, group on ${p.group})`);
      const service = startService(
        name,
        server,
        [
          '--no-defaults',
          `--user=${account}`,
          `--datadir=${files}`,
          '--bind-address=127.0.0.1',
          `--port=${p.sql}`,
          `--socket=${socket}`,
          `--pid-file=${path.join(dataDir, 'mariadb.pid')}`,
          `--log-error=${errorLog}`,
          '--skip-name-resolve',
          '--character-set-server=utf8mb4',
          '--collation-server=utf8mb4_unicode_ci',
          '--innodb-buffer-pool-size=64M',
          '--innodb-log-file-size=16M',
          '--max-connections=200',
          // What Galera requires: row-based binary log format, InnoDB, interleaved auto-increment locks.
          '--binlog-format=ROW',
          '--default-storage-engine=InnoDB',
          '--innodb-autoinc-lock-mode=2',
          '--wsrep-on=ON',
          `--wsrep-provider=${galeraProvider}`,
          '--wsrep-cluster-name=rolloff-cluster-test',
          `--wsrep-cluster-address=gcomm://${bootstrap ? '' : members}`,
          `--wsrep-node-name=${name}`,
          `--wsrep-node-address=127.0.0.1:${p.group}`,
          `--wsrep-provider-options=gmcast.listen_addr=tcp://127.0.0.1:${p.group};ist.recv_addr=127.0.0.1:${p.ist};gcache.size=64M`,
          '--wsrep-sst-method=rsync',
          `--wsrep-sst-receive-address=127.0.0.1:${p.sst}`,
        ],
        { stdio: 'ignore' },
      );
      const node = { name, service, socket, errorLog, port: p.sql };
      nodes.push(node);
      let exited = null;
      service.exited.then((status) => {
        exited = status;
      });
      const deadline = Date.now() + 120_000;
      for (;;) {
        if (exited) fail(`Galera node ${i + 1} stopped while starting. Last lines of its error log:\n${tail(errorLog, 25)}`);
        const status = wsrepStatus(socket);
        if (status?.wsrep_ready === 'ON' && status.wsrep_local_state_comment === 'Synced' && Number(status.wsrep_cluster_size) === i + 1) break;
        if (Date.now() > deadline) fail(`Galera node ${i + 1} did not join within 120 s. Last lines of its error log:\n${tail(errorLog, 25)}`);
        await new Promise((r) => setTimeout(r, 300));
      }
      info(`${name} synced; the cluster has ${i + 1} node${i === 0 ? '' : 's'}`);
      if (bootstrap) {
        // Users and grants replicate to the nodes that join, with the rest of the data.
        const quoted = password.replace(/'/g, "''");
        const created = client(
          socket,
          [
            `CREATE DATABASE IF NOT EXISTS \`${database}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci;`,
            `CREATE USER IF NOT EXISTS '${user}'@'127.0.0.1' IDENTIFIED BY '${quoted}';`,
            `GRANT ALL PRIVILEGES ON \`${database}\`.* TO '${user}'@'127.0.0.1';`,
          ].join(' '),
        );
        if (created.status !== 0) fail(`Could not create the database and its user:\n${created.stderr}`);
      }
    }
  } catch (error) {
    await stop();
    throw error;
  }

  return {
    nodes: nodes.map((node) => ({
      name: node.name,
      env: { DB_HOST: '127.0.0.1', DB_PORT: String(node.port), DB_USER: user, DB_PASSWORD: password, DB_NAME: database, DATABASE_URL: '' },
    })),
    /** wsrep status of every node, for the report. */
    status: () => nodes.map((node) => ({ name: node.name, ...wsrepStatus(node.socket) })),
    stop,
  };
}
