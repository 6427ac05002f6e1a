/**
 * The API process: listens, connects to MariaDB (retrying until it answers), and stops
 * cleanly on SIGINT/SIGTERM. It runs its share of the mail outbox's sender loop; mail it
 * leaves behind waits in the outbox for the next process.
 */
import { createApp } from './app.js';
import { closeCellChecks } from './cell-check-pool.js';
import { config, mailConfig } from './config.js';
import { connect, disconnect } from './db/connection.js';
import { createHttpServer } from './http-server.js';
import { createRelay } from './mail/mailer.js';
import { createOutbox } from './mail/outbox.js';
import { nameWorkerInResponses } from './worker-header.js';

const mail = mailConfig();
const relay = createRelay(mail);
const outbox = createOutbox({ database: connect, relay, timing: mail.outbox });
const app = createApp({ webDist: config.production ? config.webDist : null, outbox, mailStandinUrl: mail.standinUrl });

const server = createHttpServer(app).listen(config.port, config.host, () => {
  console.log(`api listening on http://${config.host}:${config.port}`);
});
nameWorkerInResponses(server);
server.on('error', (error: NodeJS.ErrnoException) => {
  console.error(error.code === 'EADDRINUSE' ? `Port ${config.port} is already in use (set API_PORT).` : error);
  process.exit(1);
});

connect().catch((error: Error) => {
  console.error(`MariaDB is not answering yet (${error.message}); /api/health reports it until it does.`);
});
outbox.start();

/** How long a stop waits for the message being sent; one cut off is sent again once its claim lapses. */
const mailGraceMs = 3000;

let stopping = false;
async function stop(): Promise<void> {
  if (stopping) return;
  stopping = true;
  server.close();
  server.closeAllConnections();
  await Promise.race([outbox.stop(), new Promise((resolve) => setTimeout(resolve, mailGraceMs))]);
  relay.close();
  await closeCellChecks();
  await disconnect().catch(() => undefined);
  process.exit(0);
}
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());
