/**
 * Outgoing e-mail through nodemailer. Sending never blocks or fails the request that caused
 * it: `deliver` returns at once and retries a few times in the background, logging failures.
 * In development and tests SMTP_HOST/SMTP_PORT point at the local stand-in.
 */
import nodemailer from 'nodemailer';
import type { Transporter } from 'nodemailer';

export interface OutgoingMail {
  to: string[];
  subject: string;
  text: string;
  html?: string;
}

export interface MailerOptions {
  host: string;
  port: number;
  from: string;
  /** Waits before each retry, in ms; the first attempt is immediate. */
  retryDelays?: number[];
  /** Told of every final outcome; the server records it in the mail log. */
  onOutcome?: (mail: OutgoingMail, outcome: { ok: boolean; attempts: number; error?: string }) => void;
}

export interface Mailer {
  /** Queues a message; resolves when it was delivered or given up on (tests may await it). */
  deliver(mail: OutgoingMail): Promise<boolean>;
  /** Resolves when nothing is left in flight. */
  idle(): Promise<void>;
  close(): void;
}

const wait = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

export function createMailer({ host, port, from, retryDelays = [1000, 5000, 15000], onOutcome }: MailerOptions): Mailer {
  const transport: Transporter = nodemailer.createTransport({
    host,
    port,
    secure: false,
    ignoreTLS: host === '127.0.0.1' || host === 'localhost',
    connectionTimeout: 5000,
  });
  const inFlight = new Set<Promise<boolean>>();

  async function attempt(mail: OutgoingMail): Promise<boolean> {
    let lastError = '';
    for (let i = 0; i <= retryDelays.length; i++) {
      if (i > 0) await wait(retryDelays[i - 1]);
      try {
        await transport.sendMail({ from, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html });
        onOutcome?.(mail, { ok: true, attempts: i + 1 });
        return true;
      } catch (error) {
        lastError = (error as Error).message;
        console.warn(`mail to ${mail.to.join(', ')} failed (attempt ${i + 1}): ${lastError}`);
      }
    }
    onOutcome?.(mail, { ok: false, attempts: retryDelays.length + 1, error: lastError });
    return false;
  }

  return {
    deliver(mail) {
      if (mail.to.length === 0) return Promise.resolve(true);
      const job = attempt(mail).finally(() => inFlight.delete(job));
      inFlight.add(job);
      return job;
    },
    async idle() {
      await Promise.all([...inFlight]);
    },
    close() {
      transport.close();
    },
  };
}
