// E-mail for the start and test commands: the local SMTP stand-in (its own process on
// loopback, with an HTTP mailbox) unless SMTP_HOST names a real mail server.
import path from 'node:path';
import { fail, info, step } from './log.mjs';
import { requireFreePort, waitForPort } from './ports.mjs';
import { apiDist, root } from './prepare.mjs';
import { startService } from './run.mjs';

/** Whether this run starts its own stand-in: always for tests, else unless SMTP_HOST is set. */
export function startsMailStandin({ always = false } = {}) {
  return always || !process.env.SMTP_HOST;
}

/** Fails early, naming the variables, when a port of the stand-in is taken. */
export async function requireMailStandinPorts(smtpPort, httpPort, smtpVariable, httpVariable, options = {}) {
  if (!startsMailStandin(options)) return;
  await requireFreePort(smtpPort, 'the mail stand-in', smtpVariable);
  await requireFreePort(httpPort, "the mail stand-in's mailbox", httpVariable);
}

/**
 * Starts the stand-in on 127.0.0.1 (SMTP on `smtpPort`, its mailbox on `httpPort`) when this
 * run needs one, and returns it (or null) with the environment that points the server at the
 * mail server in use: SMTP_HOST, SMTP_PORT and, for the stand-in, MAIL_STANDIN_URL.
 * `always` starts it even when SMTP_HOST is set, so the tests can read what was sent.
 */
export async function startMail(smtpPort, httpPort, { always = false } = {}) {
  if (!startsMailStandin({ always })) {
    info(`Mail goes out through ${process.env.SMTP_HOST}:${process.env.SMTP_PORT ?? smtpPort} (SMTP_HOST is set)`);
    return { service: null, env: {} };
  }
  step(`Starting the mail stand-in (SMTP on 127.0.0.1:${smtpPort}, mailbox on 127.0.0.1:${httpPort})`);
  const service = startService('mail stand-in', process.execPath, [path.join(apiDist, 'standins/smtp/server.js')], {
    cwd: root,
    env: { ...process.env, SMTP_STANDIN_PORT: String(smtpPort), SMTP_STANDIN_HTTP_PORT: String(httpPort) },
  });
  let exited = false;
  service.exited.then(() => {
    exited = true;
  });
  const up = (await waitForPort(smtpPort, 10_000)) && (await waitForPort(httpPort, 10_000));
  if (!up || exited) {
    await service.stop();
    fail(`The mail stand-in did not start on ports ${smtpPort} and ${httpPort}.`);
  }
  return {
    service,
    env: { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(smtpPort), MAIL_STANDIN_URL: `http://127.0.0.1:${httpPort}` },
  };
}
