/**
 * Who may do what: the role table of architecture.md and nothing else. Deny unless a role
 * of the caller grants the action. Every route asks here; none decides on its own.
 */
import type { NotebookPermissions, NotebookRole } from './contract/notebooks.js';
import { forbidden, notFound } from './errors.js';

export type SiteRole = 'admin' | 'member';

/** The signed-in person, as far as the policy cares. */
export interface Actor {
  id: number;
  siteRole: SiteRole;
  disabled: boolean;
}

/** What the policy needs to know about a notebook and the caller's place in it. */
export interface NotebookAccess {
  ownerId: number;
  visibility: 'private' | 'link';
  deletedAt: Date | null;
  /** The caller's member role, if they are a member. */
  memberRole: 'editor' | 'reviewer' | 'viewer' | null;
}

/**
 * - read: read the notebook, its cells, revisions, versions, forks and members
 * - fork: copy it into a notebook of one's own
 * - review: pin, comment, sign off a review
 * - edit: edit cells, upload bench data, make versions, rename
 * - share: members, roles, link sharing
 * - delete: delete the notebook, and restore it
 */
export type NotebookAction = keyof NotebookPermissions;
/** Site actions: managing people, reading the development mailbox (everyone's mail), the state of outgoing mail. */
export type SiteAction = 'manage-users' | 'read-dev-mail' | 'read-mail-status';

/** A column of the role table. A link-shared notebook puts every signed-in user in `viewer`. */
type Column = NotebookRole | 'site-admin';

const table: Record<Column, readonly NotebookAction[]> = {
  viewer: ['read', 'fork'],
  reviewer: ['read', 'fork', 'review'],
  editor: ['read', 'fork', 'review', 'edit'],
  owner: ['read', 'fork', 'review', 'edit', 'share', 'delete'],
  'site-admin': ['read', 'fork'],
};

/** What a deleted notebook still allows its owner: to see it and to restore it. */
const onDeleted: readonly NotebookAction[] = ['read', 'delete'];

const actions: readonly NotebookAction[] = ['read', 'fork', 'review', 'edit', 'share', 'delete'];
const strength: readonly NotebookRole[] = ['viewer', 'reviewer', 'editor', 'owner'];

function columnsOf(actor: Actor, notebook: NotebookAccess): Column[] {
  const columns: Column[] = [];
  if (notebook.ownerId === actor.id) columns.push('owner');
  if (notebook.memberRole) columns.push(notebook.memberRole);
  if (notebook.visibility === 'link') columns.push('viewer');
  if (actor.siteRole === 'admin') columns.push('site-admin');
  return columns;
}

/** May `actor` do `action` on `notebook` (or, for site actions, on the site)? */
export function can(actor: Actor | null | undefined, action: SiteAction): boolean;
export function can(actor: Actor | null | undefined, action: NotebookAction, notebook: NotebookAccess): boolean;
export function can(actor: Actor | null | undefined, action: NotebookAction | SiteAction, notebook?: NotebookAccess): boolean {
  if (!actor || actor.disabled) return false;
  if (action === 'manage-users' || action === 'read-dev-mail' || action === 'read-mail-status') return actor.siteRole === 'admin';
  if (!notebook) return false;
  const columns = columnsOf(actor, notebook);
  if (notebook.deletedAt) return columns.includes('owner') && onDeleted.includes(action);
  return columns.some((column) => table[column].includes(action));
}

/** Every notebook action at once, for the web to show only what works. */
export function permissionsOf(actor: Actor | null | undefined, notebook: NotebookAccess): NotebookPermissions {
  return Object.fromEntries(actions.map((action) => [action, can(actor, action, notebook)])) as NotebookPermissions;
}

/**
 * The caller's role as a notebook role: the strongest role that applies, where a site admin
 * and a link visitor count as viewers (their column grants exactly what a viewer's does).
 * Null when the caller may not read the notebook.
 */
export function effectiveRole(actor: Actor | null | undefined, notebook: NotebookAccess): NotebookRole | null {
  if (!actor || !can(actor, 'read', notebook)) return null;
  const roles = columnsOf(actor, notebook).map((column) => (column === 'site-admin' ? 'viewer' : column));
  return roles.reduce<NotebookRole>((best, role) => (strength.indexOf(role) > strength.indexOf(best) ? role : best), 'viewer');
}

/**
 * Throws unless `actor` may do `action`: 404 when they may not even read the notebook (so a
 * private notebook does not reveal that it exists), 403 when they may read but not do this.
 */
export function authorize(actor: Actor | null | undefined, action: NotebookAction, notebook: NotebookAccess): void {
  if (!can(actor, 'read', notebook)) throw notFound('The notebook');
  if (!can(actor, action, notebook)) throw forbidden(`Your role in this notebook does not allow you to ${describe[action]}.`);
}

/** Throws 403 unless `actor` may do the site action. */
export function authorizeSite(actor: Actor | null | undefined, action: SiteAction): void {
  if (!can(actor, action)) throw forbidden(`Only a site admin may ${describeSite[action]}.`);
}

const describeSite: Record<SiteAction, string> = {
  'manage-users': 'manage users',
  'read-dev-mail': 'read the development mailbox',
  'read-mail-status': 'see the state of outgoing mail',
};

const describe: Record<NotebookAction, string> = {
  read: 'read it',
  fork: 'fork it',
  review: 'review it',
  edit: 'edit it',
  share: 'change who it is shared with',
  delete: 'delete or restore it',
};
