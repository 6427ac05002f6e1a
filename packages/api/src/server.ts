/**
 * The API process: listens, connects to MariaDB (retrying until it answers), and stops
 * cleanly on SIGINT/SIGTERM, giving e-mail still in flight a moment to go out.
 */
import { createApp } from './app.js';
import { closeCellChecks } from './cell-check-pool.js';
import { config, mailConfig } from './config.js';
import { connect, disconnect } from './db/connection.js';
import { createHttpServer } from './http-server.js';
import { createNotifier } from './mail/notifier.js';

const mail = mailConfig();
const notifier = createNotifier({ smtp: mail, database: connect });
const app = createApp({ webDist: config.production ? config.webDist : null, notifier, mailStandinUrl: mail.standinUrl });

const server = createHttpServer(app).listen(config.port, config.host, () => {
  console.log(`api listening on http://${config.host}:${config.port}`);
});
server.on('error', (error: NodeJS.ErrnoException) => {
  console.error(error.code === 'EADDRINUSE' ? `Port ${config.port} is already in use (set API_PORT).` : error);
  process.exit(1);
});

connect().catch((error: Error) => {
  console.error(`MariaDB is not answering yet (${error.message}); /api/health reports it until it does.`);
});

/** How long a stop waits for mail in flight; what is still retrying stays `queued` in mail_log. */
const mailGraceMs = 3000;

let stopping = false;
async function stop(): Promise<void> {
  if (stopping) return;
  stopping = true;
  server.close();
  server.closeAllConnections();
  await Promise.race([notifier.idle(), new Promise((resolve) => setTimeout(resolve, mailGraceMs))]);
  notifier.close();
  await closeCellChecks();
  await disconnect().catch(() => undefined);
  process.exit(0);
}
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());
