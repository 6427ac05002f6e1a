/**
 * Who gets a message: of the people an event concerns, those who still may read the
 * notebook, have an address, and have not turned that kind of mail off.
 */
import type { EntityManager } from 'typeorm';
import { cellName } from '../contract/cells.js';
import type { CellKind } from '../contract/cells.js';
import type { MailKind } from '../contract/settings.js';
import { can } from '../policy.js';
import type { NotebookAccess } from '../policy.js';

export interface Recipient {
  id: number;
  login: string;
  name: string;
  email: string;
}

/** The notebook as mail needs it: its title and what the policy asks about it. */
export interface MailNotebook extends Omit<NotebookAccess, 'memberRole'> {
  id: string;
  title: string;
}

export async function mailNotebook(manager: EntityManager, notebookId: string): Promise<MailNotebook | null> {
  const rows: MailNotebook[] = await manager.query('SELECT id, title, ownerId, visibility, deletedAt FROM notebooks WHERE id = ?', [notebookId]);
  return rows[0] ?? null;
}

/** A cell's name as every screen gives it ("Circuit 2"). */
export async function mailCellName(manager: EntityManager, cellId: number): Promise<string> {
  const [cell]: { kind: CellKind; title: string | null; position: number; deletedAt: Date | null }[] = await manager.query(
    'SELECT kind, title, position, deletedAt FROM cells WHERE id = ?',
    [cellId],
  );
  return cell ? cellName({ ...cell, deleted: cell.deletedAt !== null }) : 'a deleted cell';
}

/** The owner and the editors of a notebook. */
export async function ownerAndEditors(manager: EntityManager, notebook: MailNotebook): Promise<number[]> {
  const editors: { userId: number }[] = await manager.query("SELECT userId FROM notebook_members WHERE notebookId = ? AND role = 'editor'", [notebook.id]);
  return [notebook.ownerId, ...editors.map((e) => e.userId)];
}

const columnOf: Record<MailKind, string> = {
  reviewRequests: 's.reviewRequests',
  reviewDecisions: 's.reviewDecisions',
  pinReplies: 's.pinReplies',
  addedToNotebook: 's.addedToNotebook',
};

/** The people among `userIds` (each once, `exceptId` left out) who should get mail of `kind`. */
export async function recipientsAmong(
  manager: EntityManager,
  notebook: MailNotebook,
  userIds: number[],
  kind: MailKind,
  exceptId: number,
): Promise<Recipient[]> {
  const ids = [...new Set(userIds)].filter((id) => id !== exceptId);
  if (ids.length === 0) return [];
  const rows: (Recipient & {
    email: string | null;
    siteRole: 'admin' | 'member';
    disabled: number;
    memberRole: NotebookAccess['memberRole'];
    wants: number | null;
  })[] = await manager.query(
    `SELECT u.id, u.login, u.name, u.email, u.siteRole, u.disabled, m.role AS memberRole, ${columnOf[kind]} AS wants
         FROM users u
         LEFT JOIN notebook_members m ON m.notebookId = ? AND m.userId = u.id
         LEFT JOIN user_mail_settings s ON s.userId = u.id
        WHERE u.id IN (?)
        ORDER BY u.id`,
    [notebook.id, ids],
  );
  return rows
    .filter((row) => row.email && row.wants !== 0)
    .filter((row) => can({ id: row.id, siteRole: row.siteRole, disabled: Boolean(row.disabled) }, 'read', { ...notebook, memberRole: row.memberRole }))
    .map((row) => ({ id: row.id, login: row.login, name: row.name, email: row.email! }));
}
