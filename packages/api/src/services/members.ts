/** Notebook members: the owner and everyone with a role in the notebook. */
import type { Member, MemberList } from '../contract/members.js';
import { NotebookMember } from '../db/entities/notebook-member.js';
import { notFound, validation } from '../errors.js';
import type { Actor } from '../policy.js';
import { presentMember } from '../presenters/member.js';
import { loadNotebookFor } from './access.js';
import { inTransaction, managerOf } from './db.js';
import type { Database } from './db.js';

export interface MemberRow {
  userId: number;
  login: string;
  name: string;
  role: 'owner' | 'editor' | 'reviewer' | 'viewer';
  addedAt: Date;
}

async function memberRows(db: Database, notebookId: string): Promise<MemberRow[]> {
  return db.query(
    `SELECT o.id AS userId, o.login, o.name, 'owner' AS role, n.createdAt AS addedAt, 0 AS sort
       FROM notebooks n JOIN users o ON o.id = n.ownerId WHERE n.id = ?
     UNION ALL
     SELECT u.id, u.login, u.name, m.role, m.createdAt, 1
       FROM notebook_members m JOIN users u ON u.id = m.userId WHERE m.notebookId = ?
     ORDER BY sort, addedAt, userId`,
    [notebookId, notebookId],
  );
}

/** `GET /api/notebooks/:id/members`: anyone who may read the notebook sees who else may. */
export async function listMembers(db: Database, actor: Actor, notebookId: string): Promise<MemberList> {
  await loadNotebookFor(managerOf(db), actor, notebookId, 'read');
  return { items: (await memberRows(db, notebookId)).map(presentMember) };
}

/** `PUT /api/notebooks/:id/members/:userId` (owner): adds the person or changes their role. */
export async function putMember(
  db: Database,
  actor: Actor,
  notebookId: string,
  userId: number,
  role: 'editor' | 'reviewer' | 'viewer',
): Promise<{ created: boolean; member: Member }> {
  return inTransaction(db, async (manager) => {
    const notebook = await loadNotebookFor(manager, actor, notebookId, 'share', { lock: true });
    if (userId === notebook.ownerId) throw validation('The owner already has every right in the notebook; give a role to someone else.');
    const users: { id: number; disabled: number }[] = await manager.query('SELECT id, disabled FROM users WHERE id = ?', [userId]);
    if (!users[0] || users[0].disabled) throw notFound('That user');
    const existing = await manager.findOneBy(NotebookMember, { notebookId, userId });
    if (existing) await manager.update(NotebookMember, { notebookId, userId }, { role });
    else await manager.insert(NotebookMember, { notebookId, userId, role, createdAt: new Date() });
    const rows: MemberRow[] = await manager.query(
      'SELECT u.id AS userId, u.login, u.name, m.role, m.createdAt AS addedAt FROM notebook_members m JOIN users u ON u.id = m.userId WHERE m.notebookId = ? AND m.userId = ?',
      [notebookId, userId],
    );
    return { created: !existing, member: presentMember(rows[0]!) };
  });
}

/** `DELETE /api/notebooks/:id/members/:userId` (owner). */
export async function removeMember(db: Database, actor: Actor, notebookId: string, userId: number): Promise<void> {
  await inTransaction(db, async (manager) => {
    await loadNotebookFor(manager, actor, notebookId, 'share', { lock: true });
    const result = await manager.delete(NotebookMember, { notebookId, userId });
    if (!result.affected) throw notFound('That member');
  });
}
