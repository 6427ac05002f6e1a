/**
 * The API process: listens, connects to MariaDB (retrying until it answers), and stops
 * cleanly on SIGINT/SIGTERM.
 */
import { createApp } from './app.js';
import { config } from './config.js';
import { connect, disconnect } from './db/connection.js';

const app = createApp({ webDist: config.production ? config.webDist : null });

const server = app.listen(config.port, config.host, () => {
  console.log(`api listening on http://${config.host}:${config.port}`);
});
server.on('error', (error: NodeJS.ErrnoException) => {
  console.error(error.code === 'EADDRINUSE' ? `Port ${config.port} is already in use (set API_PORT).` : error);
  process.exit(1);
});

connect().catch((error: Error) => {
  console.error(`MariaDB is not answering yet (${error.message}); /api/health reports it until it does.`);
});

let stopping = false;
async function stop(): Promise<void> {
  if (stopping) return;
  stopping = true;
  server.close();
  server.closeAllConnections();
  await disconnect().catch(() => undefined);
  process.exit(0);
}
process.on('SIGINT', () => void stop());
process.on('SIGTERM', () => void stop());
