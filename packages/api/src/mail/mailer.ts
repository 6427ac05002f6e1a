/**
 * The mail relay through nodemailer: one attempt per call, and what a failure means. A 5xx
 * reply to a message is permanent (the relay will never take it); anything else — a 4xx, a
 * refused or dropped connection, a timeout — is temporary and worth trying again later.
 * In development and tests SMTP_HOST/SMTP_PORT point at the local stand-in.
 */
import nodemailer from 'nodemailer';
import type { Transporter } from 'nodemailer';

export interface OutgoingMail {
  to: string;
  subject: string;
  text: string;
}

/** A failure is `permanent` (never retry) or not; `unreachable` when no SMTP reply came at all. */
export type SendOutcome = { ok: true } | { ok: false; permanent: boolean; unreachable: boolean; error: string };

/** Whether the relay answers: it greets us (and takes our credentials, if any). */
export type RelayState = { state: 'up' } | { state: 'down'; error: string };

export interface Relay {
  /** `host:port`, for messages and the admin page. */
  address: string;
  /** One attempt; the connection stays open for the next message until `release()`. */
  send(mail: OutgoingMail): Promise<SendOutcome>;
  /** Closes the connection `send` opened (a relay should not be held idle). */
  release(): void;
  check(): Promise<RelayState>;
  close(): void;
}

export interface RelayOptions {
  host: string;
  port: number;
  from: string;
}

interface SmtpError {
  message?: string;
  code?: string;
  responseCode?: number;
}

/**
 * A failure as the outbox needs it. A relay refusing our own credentials (EAUTH) answers 5xx
 * too, but that is the operator's to fix, so the mail waits instead of being dropped.
 */
export function classifyFailure(error: unknown): { permanent: boolean; unreachable: boolean; error: string } {
  const e = (error ?? {}) as SmtpError;
  const message = (e.message ?? String(error)).slice(0, 900);
  const replied = typeof e.responseCode === 'number';
  const permanent = replied && e.responseCode! >= 500 && e.responseCode! < 600 && e.code !== 'EAUTH';
  return { permanent, unreachable: !replied, error: e.code && !message.includes(e.code) ? `${e.code}: ${message}` : message };
}

const checkBudgetMs = 2000;

export function createRelay({ host, port, from }: RelayOptions): Relay {
  const options = (timeoutMs: number) => ({
    host,
    port,
    secure: false,
    ignoreTLS: host === '127.0.0.1' || host === 'localhost',
    connectionTimeout: timeoutMs,
    greetingTimeout: timeoutMs,
    socketTimeout: 30_000,
  });
  // Pooled, one connection: many messages in a row are sent without greeting the relay for each.
  let pooled: Transporter | null = null;
  const probe: Transporter = nodemailer.createTransport(options(checkBudgetMs));
  const release = () => {
    pooled?.close();
    pooled = null;
  };
  return {
    address: `${host}:${port}`,
    async send(mail) {
      pooled ??= nodemailer.createTransport({ ...options(5000), pool: true, maxConnections: 1 });
      try {
        await pooled.sendMail({ from, to: [mail.to], subject: mail.subject, text: mail.text });
        return { ok: true };
      } catch (error) {
        return { ok: false, ...classifyFailure(error) };
      }
    },
    async check() {
      try {
        await probe.verify();
        return { state: 'up' };
      } catch (error) {
        return { state: 'down', error: classifyFailure(error).error };
      }
    },
    release,
    close() {
      release();
      probe.close();
    },
  };
}
