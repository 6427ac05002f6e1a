// E-mail for the start and test commands: the local SMTP stand-in (its own process on
// loopback, with an HTTP mailbox) unless SMTP_HOST names a real mail server. The server keeps
// mail in its outbox while the relay is away, so the stand-in stopping stops nothing else:
// it is started again after a pause.
import path from 'node:path';
import { fail, info, step, warn } from './log.mjs';
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

/** The first pause before the stand-in is started again after it stopped; it doubles up to a minute. */
const firstRestartPauseMs = 2000;

/**
 * Runs the stand-in and starts it again whenever it stops on its own. Resolves once its first
 * start answers on both ports (or it failed to); `stop()` ends it for good.
 */
async function keepStandinRunning(smtpPort, httpPort) {
  let current;
  let stopped = false;
  let timer;
  let pause = firstRestartPauseMs;
  const launch = () => {
    const service = startService('mail stand-in', process.execPath, [path.join(apiDist, 'standins/smtp/server.js')], {
      cwd: root,
      env: { ...process.env, SMTP_STANDIN_PORT: String(smtpPort), SMTP_STANDIN_HTTP_PORT: String(httpPort) },
    });
    current = service;
    service.exited.then(({ code, signal }) => {
      if (stopped || current !== service) return;
      warn(
        `The mail stand-in stopped (${signal ?? `exit ${code}`}); Rolloff keeps running and mail waits in its outbox. Starting the stand-in again in ${pause / 1000} s.`,
      );
      timer = setTimeout(() => {
        if (stopped) return;
        const again = launch();
        void waitForPort(smtpPort, 10_000).then((up) => {
          if (up && current === again) pause = firstRestartPauseMs;
        });
      }, pause);
      pause = Math.min(pause * 2, 60_000);
    });
    return service;
  };
  const first = launch();
  let exited = false;
  first.exited.then(() => {
    exited = true;
  });
  const up = (await waitForPort(smtpPort, 10_000)) && (await waitForPort(httpPort, 10_000));
  const kept = {
    name: 'mail stand-in',
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await current.stop();
    },
  };
  if (!up || exited) {
    await kept.stop();
    fail(`The mail stand-in did not start on ports ${smtpPort} and ${httpPort}.`);
  }
  return kept;
}

/**
 * Starts the stand-in on 127.0.0.1 (SMTP on `smtpPort`, its mailbox on `httpPort`) when this
 * run needs one, kept running, and returns it (or null) with the environment that points the
 * server at the mail server in use: SMTP_HOST, SMTP_PORT and, for the stand-in, MAIL_STANDIN_URL.
 * `always` starts it even when SMTP_HOST is set, so the tests can read what was sent.
 */
export async function startMail(smtpPort, httpPort, { always = false } = {}) {
  if (!startsMailStandin({ always })) {
    info(`Mail goes out through ${process.env.SMTP_HOST}:${process.env.SMTP_PORT ?? smtpPort} (SMTP_HOST is set)`);
    return { service: null, env: {} };
  }
  step(`Starting the mail stand-in (SMTP on 127.0.0.1:${smtpPort}, mailbox on 127.0.0.1:${httpPort})`);
  return {
    service: await keepStandinRunning(smtpPort, httpPort),
    env: { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(smtpPort), MAIL_STANDIN_URL: `http://127.0.0.1:${httpPort}` },
  };
}
