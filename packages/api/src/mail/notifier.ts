/**
 * E-mail about what happened in a notebook. A route runs its action through `withMail`: the
 * action and the mail it causes (recipients found, each message composed and queued in the
 * outbox) share one transaction, so mail exists exactly when the change was stored and is
 * never lost to a crash or a relay that is away. The outbox's sender loop sends it after the
 * commit; the request never waits for the relay.
 */
import type { Request } from 'express';
import type { EntityManager } from 'typeorm';
import type { Pin, PinComment } from '../contract/pins.js';
import type { DecisionState, Review } from '../contract/reviews.js';
import type { MailKind } from '../contract/settings.js';
import { connect } from '../db/connection.js';
import { inTransaction } from '../services/db.js';
import { addedToNotebookMail, pinReplyMail, reviewDecidedMail, reviewRequestedMail } from './messages.js';
import type { ComposedMail, MailContext } from './messages.js';
import { queueMail } from './outbox.js';
import type { Outbox } from './outbox.js';
import { mailCellName, mailNotebook, ownerAndEditors, recipientsAmong } from './recipients.js';
import type { MailNotebook } from './recipients.js';

/** The person whose action caused the mail. */
export interface MailActor {
  id: number;
  name: string;
  login: string;
}

/** The mail of one action, queued in its transaction. */
export interface Notifier {
  /** To each person newly asked to review. */
  reviewRequested(input: { review: Review; askedIds: number[] }): Promise<void>;
  /** To the requester and the notebook's owner and editors. */
  reviewDecided(input: { review: Review; state: DecisionState; summary: string }): Promise<void>;
  /** To everyone who wrote in the thread before this reply. */
  pinReplied(input: { pin: Pin; comment: PinComment }): Promise<void>;
  /** To the person given a role. */
  memberAdded(input: { notebookId: string; userId: number; role: 'editor' | 'reviewer' | 'viewer' }): Promise<void>;
}

const displayName = (person: MailActor) => person.name || person.login;

/**
 * The notifier of one transaction. `baseUrl` is where links point (PUBLIC_URL, or the address
 * the request came to); `by` is left out of the recipients.
 */
export function notifierFor(manager: EntityManager, { baseUrl, by }: { baseUrl: string; by: MailActor }): Notifier {
  /**
   * The common path of every event: load the notebook, pick the recipients among `userIds`,
   * compose the message and queue one per person, so each gets only their own address.
   */
  async function notify(
    notebookId: string,
    kind: MailKind,
    userIds: (notebook: MailNotebook) => Promise<number[]>,
    compose: (context: MailContext) => ComposedMail | Promise<ComposedMail>,
  ): Promise<void> {
    const notebook = await mailNotebook(manager, notebookId);
    if (!notebook) return;
    const recipients = await recipientsAmong(manager, notebook, await userIds(notebook), kind, by.id);
    if (recipients.length === 0) return;
    const composed = await compose({ baseUrl, notebook: { id: notebook.id, title: notebook.title } });
    for (const recipient of recipients) {
      await queueMail(manager, { to: recipient.email, userId: recipient.id, kind, notebookId, subject: composed.subject, text: composed.text });
    }
  }

  return {
    reviewRequested({ review, askedIds }) {
      return notify(
        review.notebookId,
        'reviewRequests',
        async () => askedIds,
        (context) =>
          reviewRequestedMail(context, {
            reviewId: review.id,
            round: review.round,
            version: review.version,
            requester: displayName(by),
            message: review.message,
          }),
      );
    },
    reviewDecided({ review, state, summary }) {
      return notify(
        review.notebookId,
        'reviewDecisions',
        async (notebook) => [...(review.requestedBy ? [review.requestedBy.id] : []), ...(await ownerAndEditors(manager, notebook))],
        (context) =>
          reviewDecidedMail(context, {
            reviewId: review.id,
            round: review.round,
            versionNumber: review.version.number,
            reviewer: displayName(by),
            state,
            summary,
          }),
      );
    },
    pinReplied({ pin, comment }) {
      const earlier = pin.comments.filter((c) => c.id !== comment.id && c.author).map((c) => c.author!.id);
      return notify(
        pin.notebookId,
        'pinReplies',
        async () => earlier,
        async (context) =>
          pinReplyMail(context, {
            pinId: pin.id,
            cell: await mailCellName(manager, pin.cellId),
            revisionNumber: pin.revisionNumber,
            trace: pin.trace,
            frequency: pin.frequency,
            author: displayName(by),
            body: comment.body,
          }),
      );
    },
    memberAdded({ notebookId, userId, role }) {
      return notify(
        notebookId,
        'addedToNotebook',
        async () => [userId],
        (context) => addedToNotebookMail(context, { by: displayName(by), role }),
      );
    },
  };
}

/** What the app keeps for the routes: the outbox and the configured public address. */
export interface AppMail {
  outbox: Outbox;
  publicUrl: string | null;
}

/** The app's outbox (set up by createApp). */
export function outboxOf(req: Request): Outbox {
  const mail = req.app.locals.mail as AppMail | undefined;
  if (!mail) throw new Error('outboxOf(): the app was created without an outbox');
  return mail.outbox;
}

/**
 * Runs a route's action and queues the mail it causes in one transaction (retried whole on a
 * deadlock), then wakes this process's sender. Links point at PUBLIC_URL, or else the address
 * the request came to.
 */
export async function withMail<T>(req: Request, by: MailActor, work: (manager: EntityManager, mail: Notifier) => Promise<T>): Promise<T> {
  const { publicUrl } = req.app.locals.mail as AppMail;
  const baseUrl = publicUrl ?? `${req.protocol}://${req.get('host')}`;
  const result = await inTransaction(await connect(), (manager) => work(manager, notifierFor(manager, { baseUrl, by })));
  outboxOf(req).wake();
  return result;
}
