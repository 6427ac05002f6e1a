/**
 * The local SMTP stand-in used in development and tests: a real SMTP server (smtp-server)
 * on loopback that keeps what it receives, and a small HTTP mailbox to read it back.
 */
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import express from 'express';
import { simpleParser } from 'mailparser';
import type { AddressObject } from 'mailparser';
import { SMTPServer } from 'smtp-server';

export interface StoredMessage {
  id: number;
  receivedAt: string;
  /** SMTP envelope recipients (what the server was told to deliver to). */
  envelopeTo: string[];
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

export interface SmtpStandin {
  smtpPort: number;
  httpPort: number;
  messages(): StoredMessage[];
  close(): Promise<void>;
}

const keep = 1000;

/** An SMTP refusal of one recipient: a 4xx code asks the sender to try later, a 5xx never. */
export interface Refusal {
  code: number;
  message: string;
}

export interface SmtpStandinOptions {
  /** 0 picks a free port. */
  smtpPort?: number;
  httpPort?: number;
  /** Refuses the recipients it answers for, as a real relay refuses an unknown mailbox (tests see the sender's side). */
  refuse?: (address: string) => Refusal | null;
}

function addresses(field: AddressObject | AddressObject[] | undefined): string[] {
  const list = Array.isArray(field) ? field : field ? [field] : [];
  return list.flatMap((group) => group.value.map((entry) => entry.address ?? '')).filter(Boolean);
}

/** Starts the SMTP server and the HTTP mailbox. */
export async function createSmtpStandin({ smtpPort = 0, httpPort = 0, refuse }: SmtpStandinOptions = {}): Promise<SmtpStandin> {
  const stored: StoredMessage[] = [];
  let nextId = 1;

  const smtp = new SMTPServer({
    authOptional: true,
    disabledCommands: ['AUTH', 'STARTTLS'],
    banner: 'Rolloff local mail stand-in',
    size: 5 * 1024 * 1024,
    onRcptTo(address, _session, callback) {
      const refusal = refuse?.(address.address);
      if (!refusal) return callback();
      callback(Object.assign(new Error(refusal.message), { responseCode: refusal.code }));
    },
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((mail) => {
          stored.push({
            id: nextId++,
            receivedAt: new Date().toISOString(),
            envelopeTo: session.envelope.rcptTo.map((rcpt) => rcpt.address),
            from: addresses(mail.from)[0] ?? '',
            to: addresses(mail.to),
            subject: mail.subject ?? '',
            text: mail.text ?? '',
            html: typeof mail.html === 'string' ? mail.html : null,
          });
          if (stored.length > keep) stored.splice(0, stored.length - keep);
          callback();
        })
        .catch((error: Error) => callback(error));
    },
  });
  await new Promise<void>((resolve, reject) => {
    smtp.once('error', reject);
    smtp.listen(smtpPort, '127.0.0.1', () => resolve());
  });

  const app = express();
  app.get('/messages', (_req, res) => {
    res.json({ messages: [...stored].reverse() });
  });
  app.delete('/messages', (_req, res) => {
    stored.length = 0;
    res.status(204).end();
  });
  let http: Server;
  try {
    http = await new Promise((resolve, reject) => {
      // Express 5 hands a listen error (a taken port) to this callback.
      const server = app.listen(httpPort, '127.0.0.1', (error?: Error) => (error ? reject(error) : resolve(server)));
    });
  } catch (error) {
    // The mailbox's port is taken: do not leave the SMTP side listening alone.
    await new Promise<void>((resolve) => smtp.close(() => resolve()));
    throw error;
  }

  return {
    smtpPort: (smtp.server.address() as AddressInfo).port,
    httpPort: (http.address() as AddressInfo).port,
    messages: () => [...stored],
    close: async () => {
      http.closeAllConnections();
      await new Promise<void>((resolve) => http.close(() => resolve()));
      await new Promise<void>((resolve) => smtp.close(() => resolve()));
    },
  };
}
