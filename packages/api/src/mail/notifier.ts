/**
 * E-mail about what happened in a notebook. Routes call the notifier after the change is
 * committed; each call returns at once, and the work (finding recipients, composing, sending
 * with retries through the mailer, writing the mail log) runs in the background, where a
 * failure is logged and never reaches the request. Tests await `idle()` instead of sleeping.
 */
import type { Request } from 'express';
import type { DataSource, EntityManager } from 'typeorm';
import type { Pin, PinComment } from '../contract/pins.js';
import type { DecisionState, Review } from '../contract/reviews.js';
import type { MailKind } from '../contract/settings.js';
import { MailLogEntry } from '../db/entities/mail-log-entry.js';
import { createMailer } from './mailer.js';
import type { Mailer, OutgoingMail } from './mailer.js';
import { addedToNotebookMail, pinReplyMail, reviewDecidedMail, reviewRequestedMail } from './messages.js';
import type { ComposedMail, MailContext } from './messages.js';
import { mailCellName, mailNotebook, ownerAndEditors, recipientsAmong } from './recipients.js';
import type { MailNotebook, Recipient } from './recipients.js';

/** The person whose action caused the mail. */
export interface MailActor {
  id: number;
  name: string;
  login: string;
}

interface MailEvent {
  /** Where links point: PUBLIC_URL, or the address the request came to. */
  baseUrl: string;
  by: MailActor;
}

export interface Notifier {
  /** To each person newly asked to review. */
  reviewRequested(event: MailEvent & { review: Review; askedIds: number[] }): void;
  /** To the requester and the notebook's owner and editors. */
  reviewDecided(event: MailEvent & { review: Review; state: DecisionState; summary: string }): void;
  /** To everyone who wrote in the thread before this reply. */
  pinReplied(event: MailEvent & { pin: Pin; comment: PinComment }): void;
  /** To the person given a role. */
  memberAdded(event: MailEvent & { notebookId: string; userId: number; role: 'editor' | 'reviewer' | 'viewer' }): void;
  /** Resolves when every message started so far is delivered or given up on, and logged. */
  idle(): Promise<void>;
  close(): void;
}

export interface NotifierOptions {
  smtp: { host: string; port: number; from: string };
  database: () => Promise<DataSource>;
  /** Waits before each retry of a failed delivery, in ms (the mailer's default if absent). */
  retryDelays?: number[];
}

/** Who a message went to and why, for its mail log row. */
interface Delivery {
  recipient: Recipient;
  kind: MailKind;
  notebookId: string;
}

const displayName = (person: MailActor) => person.name || person.login;

export function createNotifier({ smtp, database, retryDelays }: NotifierOptions): Notifier {
  const tasks = new Set<Promise<void>>();
  const logIds = new WeakMap<OutgoingMail, Promise<number | null>>();

  /** Runs background work that nobody awaits but `idle()`; a failure is only logged. */
  function track(work: () => Promise<void>): void {
    const task: Promise<void> = work()
      .catch((error: unknown) => console.error('mail:', error))
      .finally(() => tasks.delete(task));
    tasks.add(task);
  }

  const mailer: Mailer = createMailer({
    ...smtp,
    ...(retryDelays ? { retryDelays } : {}),
    onOutcome: (mail, outcome) => {
      track(async () => {
        const id = await logIds.get(mail);
        if (id === null || id === undefined) return;
        const db = await database();
        await db
          .getRepository(MailLogEntry)
          .update(
            { id },
            { status: outcome.ok ? 'sent' : 'failed', attempts: outcome.attempts, error: outcome.error?.slice(0, 1000) ?? null, finishedAt: new Date() },
          );
      });
    },
  });

  async function logQueued(mail: OutgoingMail, delivery: Delivery): Promise<number | null> {
    try {
      const db = await database();
      const inserted = await db.getRepository(MailLogEntry).insert({
        toAddress: delivery.recipient.email,
        userId: delivery.recipient.id,
        subject: mail.subject.slice(0, 300),
        kind: delivery.kind,
        notebookId: delivery.notebookId,
        status: 'queued',
        attempts: 0,
        error: null,
        createdAt: new Date(),
        finishedAt: null,
      });
      return Number(inserted.identifiers[0]?.id);
    } catch (error) {
      // The mail still goes out; only its log row is missing.
      console.error('mail log:', error);
      return null;
    }
  }

  /** One message per person, so each gets only their own address and link. */
  async function send(delivery: Delivery, composed: ComposedMail): Promise<void> {
    const mail: OutgoingMail = { to: [delivery.recipient.email], subject: composed.subject, text: composed.text };
    const logged = logQueued(mail, delivery);
    logIds.set(mail, logged);
    await logged;
    await mailer.deliver(mail);
  }

  /**
   * The common path of every event: load the notebook, pick the recipients among `userIds`,
   * compose each one's message and send it.
   */
  function notify(
    event: MailEvent,
    notebookId: string,
    kind: MailKind,
    userIds: (manager: EntityManager, notebook: MailNotebook) => Promise<number[]>,
    compose: (context: MailContext, manager: EntityManager) => ComposedMail | Promise<ComposedMail>,
  ): void {
    track(async () => {
      const db = await database();
      const notebook = await mailNotebook(db.manager, notebookId);
      if (!notebook) return;
      const recipients = await recipientsAmong(db.manager, notebook, await userIds(db.manager, notebook), kind, event.by.id);
      const context: MailContext = { baseUrl: event.baseUrl, notebook: { id: notebook.id, title: notebook.title } };
      const composed = await compose(context, db.manager);
      await Promise.all(recipients.map((recipient) => send({ recipient, kind, notebookId }, composed)));
    });
  }

  return {
    reviewRequested(event) {
      const { review } = event;
      notify(
        event,
        review.notebookId,
        'reviewRequests',
        async () => event.askedIds,
        (context) =>
          reviewRequestedMail(context, {
            reviewId: review.id,
            round: review.round,
            version: review.version,
            requester: displayName(event.by),
            message: review.message,
          }),
      );
    },
    reviewDecided(event) {
      const { review } = event;
      notify(
        event,
        review.notebookId,
        'reviewDecisions',
        async (manager, notebook) => [...(review.requestedBy ? [review.requestedBy.id] : []), ...(await ownerAndEditors(manager, notebook))],
        (context) =>
          reviewDecidedMail(context, {
            reviewId: review.id,
            round: review.round,
            versionNumber: review.version.number,
            reviewer: displayName(event.by),
            state: event.state,
            summary: event.summary,
          }),
      );
    },
    pinReplied(event) {
      const { pin, comment } = event;
      const earlier = pin.comments.filter((c) => c.id !== comment.id && c.author).map((c) => c.author!.id);
      notify(
        event,
        pin.notebookId,
        'pinReplies',
        async () => earlier,
        async (context, manager) =>
          pinReplyMail(context, {
            pinId: pin.id,
            cell: await mailCellName(manager, pin.cellId),
            revisionNumber: pin.revisionNumber,
            trace: pin.trace,
            frequency: pin.frequency,
            author: displayName(event.by),
            body: comment.body,
          }),
      );
    },
    memberAdded(event) {
      notify(
        event,
        event.notebookId,
        'addedToNotebook',
        async () => [event.userId],
        (context) => addedToNotebookMail(context, { by: displayName(event.by), role: event.role }),
      );
    },
    async idle() {
      while (tasks.size > 0) await Promise.allSettled([...tasks]);
    },
    close() {
      mailer.close();
    },
  };
}

/** What the app keeps for the routes: its notifier and the configured public address. */
export interface AppMail {
  notifier: Notifier;
  publicUrl: string | null;
}

/**
 * The app's notifier for a request, with the base of its links: PUBLIC_URL, or else the
 * address the request came to.
 */
export function mailFor(req: Request): { notifier: Notifier; baseUrl: string } {
  const mail = req.app.locals.mail as AppMail | undefined;
  if (!mail) throw new Error('mailFor(): the app was created without a notifier');
  return { notifier: mail.notifier, baseUrl: mail.publicUrl ?? `${req.protocol}://${req.get('host')}` };
}
