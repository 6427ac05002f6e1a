/**
 * Small factories for tests: people straight into the database, notebooks through the
 * services the routes use.
 */
import { randomBytes } from 'node:crypto';
import type { Notebook as NotebookBody } from '../src/contract/notebooks.js';
import { connect } from '../src/db/connection.js';
import { User } from '../src/db/entities/user.js';
import { putMember } from '../src/services/members.js';
import { createNotebook, updateNotebook } from '../src/services/notebooks.js';

let counter = 0;

/** A unique login for this test run. */
export function uniqueLogin(prefix = 'user'): string {
  counter += 1;
  return `${prefix}-${counter}-${randomBytes(3).toString('hex')}`;
}

export interface UserOverrides {
  login?: string;
  name?: string;
  siteRole?: 'admin' | 'member';
  disabled?: boolean;
}

/** Inserts a user; sign in as them with `signedIn(url, user.login)`. */
export async function buildUser(overrides: UserOverrides = {}): Promise<User> {
  const db = await connect();
  const login = overrides.login ?? uniqueLogin();
  const repo = db.getRepository(User);
  const inserted = await repo.insert({
    login,
    name: overrides.name ?? `Test ${login}`,
    email: `${login}@example.com`,
    siteRole: overrides.siteRole ?? 'member',
    disabled: overrides.disabled ?? false,
  });
  return (await repo.findOneBy({ id: Number(inserted.identifiers[0]?.id) }))!;
}

export interface NotebookOverrides {
  owner?: User;
  title?: string;
  description?: string;
  cells?: { kind: 'circuit' | 'note'; text: string }[];
  members?: [User, 'editor' | 'reviewer' | 'viewer'][];
  visibility?: 'private' | 'link';
}

/** A simple RC low-pass in the cell language, which compiles without errors. */
export const rcLowPass = `# RC low-pass, corner near 1.6 kHz
drive in
R1 [in out] 1k
C1 [out gnd] 100n
show out
`;

/** Creates a notebook (owned by a new user unless `owner` is given), with members if asked. */
export async function buildNotebook(overrides: NotebookOverrides = {}): Promise<NotebookBody & { ownerUser: User }> {
  const db = await connect();
  const owner = overrides.owner ?? (await buildUser());
  const actor = { id: owner.id, siteRole: owner.siteRole, disabled: owner.disabled };
  let notebook = await createNotebook(db, actor, {
    title: overrides.title ?? `Notebook ${uniqueLogin('nb')}`,
    description: overrides.description,
    cells: overrides.cells ?? [
      { kind: 'note', text: 'A first-order low-pass in front of the converter.' },
      { kind: 'circuit', text: rcLowPass },
    ],
  });
  for (const [user, role] of overrides.members ?? []) await putMember(db, actor, notebook.id, user.id, role);
  if (overrides.visibility === 'link') notebook = await updateNotebook(db, actor, notebook.id, { visibility: 'link' });
  return { ...notebook, ownerUser: owner };
}
