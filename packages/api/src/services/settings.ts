/** A person's own settings: which e-mails they get (every kind is on until turned off). */
import type { EntityManager } from 'typeorm';
import type { MailKind, MailPreferences, Settings } from '../contract/settings.js';
import { inTransaction, managerOf } from './db.js';
import type { Database } from './db.js';

export const mailKinds: readonly MailKind[] = ['reviewRequests', 'reviewDecisions', 'pinReplies', 'addedToNotebook'];

const everyKindOn: MailPreferences = { reviewRequests: true, reviewDecisions: true, pinReplies: true, addedToNotebook: true };

async function preferencesOf(manager: EntityManager, userId: number, lock = false): Promise<MailPreferences> {
  const rows: Record<MailKind, number>[] = await manager.query(
    `SELECT reviewRequests, reviewDecisions, pinReplies, addedToNotebook FROM user_mail_settings WHERE userId = ?${lock ? ' FOR UPDATE' : ''}`,
    [userId],
  );
  const row = rows[0];
  if (!row) return { ...everyKindOn };
  return Object.fromEntries(mailKinds.map((kind) => [kind, Boolean(Number(row[kind]))])) as MailPreferences;
}

/** `GET /api/me/settings`. */
export async function getSettings(db: Database, userId: number): Promise<Settings> {
  return { mail: await preferencesOf(managerOf(db), userId) };
}

/** `PATCH /api/me/settings`: the kinds named change, the others stay as they are. */
export async function updateSettings(db: Database, userId: number, changes: { mail: Partial<MailPreferences> }): Promise<Settings> {
  return inTransaction(db, async (manager) => {
    const mail = { ...(await preferencesOf(manager, userId, true)), ...changes.mail };
    await manager.query(
      `INSERT INTO user_mail_settings (userId, reviewRequests, reviewDecisions, pinReplies, addedToNotebook, updatedAt)
       VALUES (?, ?, ?, ?, ?, ?)
       ON DUPLICATE KEY UPDATE reviewRequests = VALUES(reviewRequests), reviewDecisions = VALUES(reviewDecisions),
                               pinReplies = VALUES(pinReplies), addedToNotebook = VALUES(addedToNotebook), updatedAt = VALUES(updatedAt)`,
      [userId, mail.reviewRequests, mail.reviewDecisions, mail.pinReplies, mail.addedToNotebook, new Date()],
    );
    return { mail };
  });
}
