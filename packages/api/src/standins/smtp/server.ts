/** `node dist/standins/smtp/server.js`: the SMTP stand-in as its own process (npm start, npm test). */
import { createSmtpStandin } from './mailbox.js';

const smtpPort = Number(process.env.SMTP_STANDIN_PORT ?? 4412);
const httpPort = Number(process.env.SMTP_STANDIN_HTTP_PORT ?? 4413);

try {
  const standin = await createSmtpStandin({ smtpPort, httpPort });
  console.log(`mail stand-in: SMTP on 127.0.0.1:${standin.smtpPort}, mailbox on http://127.0.0.1:${standin.httpPort}/messages`);
  const stop = () => void standin.close().then(() => process.exit(0));
  process.on('SIGINT', stop);
  process.on('SIGTERM', stop);
} catch (error) {
  const code = (error as NodeJS.ErrnoException).code;
  console.error(code === 'EADDRINUSE' ? `Port ${smtpPort} or ${httpPort} is already in use (set SMTP_STANDIN_PORT / SMTP_STANDIN_HTTP_PORT).` : error);
  process.exit(1);
}
