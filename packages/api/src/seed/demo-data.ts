/**
 * The demo data, loaded once per database by `npm start` (through cli.ts). A marker row in app_state records
 * that it ran, so it never runs again, and it never touches a database that has users (other
 * than the system user the migrations make).
 * Everything loads in one transaction, through the same services the API uses.
 */
import { Not } from 'typeorm';
import type { DataSource, EntityManager } from 'typeorm';
import { SYSTEM_USER, User } from '../db/entities/user.js';
import { demoFork, demoNotebooks } from './demo-notebooks.js';
import type { DemoNotebook, DemoReview } from './demo-notebooks.js';
import { demoUsers } from './demo-users.js';
import type { Actor } from '../policy.js';
import { saveCell } from '../services/cells.js';
import { forkNotebook } from '../services/forks.js';
import { putMember } from '../services/members.js';
import { createNotebook, updateNotebook } from '../services/notebooks.js';
import { addPinComment, createPin } from '../services/pins.js';
import { decideReview, requestReview } from '../services/reviews.js';
import { createVersion } from '../services/versions.js';

const marker = 'demo-data-loaded';

/** Loads the demo data unless it was loaded before or real users exist; returns what it did. */
export async function seedDemoData(db: DataSource): Promise<'loaded' | 'already-loaded' | 'has-user-data'> {
  return db.transaction(async (manager) => {
    const done = await manager.query('SELECT value FROM app_state WHERE name = ? FOR UPDATE', [marker]);
    if (done.length > 0) return 'already-loaded';
    if ((await manager.count(User, { where: { login: Not(SYSTEM_USER.login) } })) > 0) return 'has-user-data';
    await manager.insert(
      User,
      demoUsers.map((user) => ({ ...user })),
    );
    await loadNotebooks(manager);
    await manager.query('INSERT INTO app_state (name, value) VALUES (?, ?)', [marker, new Date().toISOString()]);
    return 'loaded';
  });
}

async function loadNotebooks(manager: EntityManager): Promise<void> {
  const users = new Map((await manager.find(User)).map((user) => [user.login, user]));
  const actor = (login: string): Actor => {
    const user = users.get(login);
    if (!user) throw new Error(`demo data names an unknown user ${login}`);
    return { id: user.id, siteRole: user.siteRole, disabled: user.disabled };
  };

  const ids = new Map<string, string>();
  for (const demo of demoNotebooks) {
    const id = await loadNotebook(manager, demo, actor);
    ids.set(demo.key, id);
    await backdate(manager, id, demo.daysAgo);
  }

  const source = ids.get(demoFork.from)!;
  const fork = await forkNotebook(manager, actor(demoFork.by), source, { version: demoFork.version, title: demoFork.title });
  const cell = fork.cells[demoFork.edit.position]!;
  await saveCell(manager, actor(demoFork.by), fork.id, cell.id, { text: demoFork.edit.text, baseRevision: cell.revision });
  for (const [login, role] of demoFork.members) await putMember(manager, actor(demoFork.by), fork.id, users.get(login)!.id, role);
  await backdate(manager, fork.id, demoFork.daysAgo);
}

async function loadNotebook(manager: EntityManager, demo: DemoNotebook, actor: (login: string) => Actor): Promise<string> {
  const owner = actor(demo.owner);
  const notebook = await createNotebook(manager, owner, {
    title: demo.title,
    description: demo.description,
    cells: demo.cells.map((cell) => ({ kind: cell.kind, text: cell.text })),
  });
  for (const [login, role] of demo.members) await putMember(manager, owner, notebook.id, actor(login).id, role);
  for (const [position, cell] of demo.cells.entries()) {
    let revision = 1;
    for (const edit of cell.edits ?? []) {
      const saved = await saveCell(manager, actor(edit.by), notebook.id, notebook.cells[position]!.id, { text: edit.text, baseRevision: revision });
      revision = saved.body.cell.revision;
    }
  }
  for (const version of demo.versions) await createVersion(manager, actor(version.by), notebook.id, version.label);
  if (demo.review)
    await loadReview(
      manager,
      notebook.id,
      notebook.cells.map((cell) => cell.id),
      demo.review,
      actor,
    );
  if (demo.visibility === 'link') await updateNotebook(manager, owner, notebook.id, { visibility: 'link' });
  return notebook.id;
}

async function loadReview(manager: EntityManager, notebookId: string, cellIds: number[], demo: DemoReview, actor: (login: string) => Actor): Promise<void> {
  const { review } = await requestReview(manager, actor(demo.by), notebookId, {
    reviewerIds: demo.reviewers.map((login) => actor(login).id),
    message: demo.message,
  });
  for (const pin of demo.pins) {
    const made = await createPin(manager, actor(pin.by), notebookId, {
      cellId: cellIds[pin.cell]!,
      trace: pin.trace,
      frequency: pin.frequency,
      body: pin.text,
    });
    for (const reply of pin.replies) await addPinComment(manager, actor(reply.by), notebookId, made.id, reply.text);
  }
  for (const decision of demo.decisions)
    await decideReview(manager, actor(decision.by), notebookId, review.id, { state: decision.state, summary: decision.summary });
}

/**
 * Moves a freshly loaded notebook's history `days` into the past: the notebook and its cells
 * start a few hours before their last change, and each cell's revisions an hour and a half
 * apart, so lists and histories read like real work.
 */
async function backdate(manager: EntityManager, notebookId: string, days: number): Promise<void> {
  const shift = (column: string) => `${column} = ${column} - INTERVAL ${Number(days)} DAY`;
  await manager.query(`UPDATE notebooks SET createdAt = createdAt - INTERVAL ${Number(days)} DAY - INTERVAL 6 HOUR, ${shift('updatedAt')} WHERE id = ?`, [
    notebookId,
  ]);
  await manager.query(`UPDATE cells SET createdAt = createdAt - INTERVAL ${Number(days)} DAY - INTERVAL 6 HOUR, ${shift('updatedAt')} WHERE notebookId = ?`, [
    notebookId,
  ]);
  await manager.query(
    `UPDATE cell_revisions r JOIN cells c ON c.id = r.cellId
        SET r.createdAt = r.createdAt - INTERVAL ${Number(days)} DAY - INTERVAL ((c.revision - r.number) * 90) MINUTE
      WHERE c.notebookId = ?`,
    [notebookId],
  );
  await manager.query(`UPDATE notebook_versions SET ${shift('createdAt')} WHERE notebookId = ?`, [notebookId]);
  await manager.query(`UPDATE reviews SET ${shift('createdAt')} WHERE notebookId = ?`, [notebookId]);
  await manager.query(
    `UPDATE review_assignments a JOIN reviews rv ON rv.id = a.reviewId SET ${shift('a.createdAt')}, ${shift('a.decidedAt')} WHERE rv.notebookId = ?`,
    [notebookId],
  );
  await manager.query(`UPDATE review_decisions d JOIN reviews rv ON rv.id = d.reviewId SET ${shift('d.createdAt')} WHERE rv.notebookId = ?`, [notebookId]);
  await manager.query(`UPDATE pins SET ${shift('createdAt')} WHERE notebookId = ?`, [notebookId]);
  await manager.query(`UPDATE pin_comments c JOIN pins p ON p.id = c.pinId SET ${shift('c.createdAt')} WHERE p.notebookId = ?`, [notebookId]);
  await manager.query(`UPDATE notebook_members SET createdAt = createdAt - INTERVAL ${Number(days)} DAY - INTERVAL 6 HOUR WHERE notebookId = ?`, [notebookId]);
}
