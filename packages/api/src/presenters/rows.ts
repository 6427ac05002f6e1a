/** The shapes of the rows the services read with SQL, before presenters turn them into JSON. */

export interface UserRefRow {
  id: number;
  login: string;
  name: string;
}

/** A notebook with its owner, the caller's member role and two counts. */
export interface NotebookRow {
  id: string;
  title: string;
  ownerId: number;
  ownerLogin: string;
  ownerName: string;
  visibility: 'private' | 'link';
  forkedFromId: string | null;
  forkedFromVersionId: number | null;
  memberRole: 'editor' | 'reviewer' | 'viewer' | null;
  cellCount: number | string;
  forkCount: number | string;
  createdAt: Date;
  updatedAt: Date;
  deletedAt: Date | null;
}

/** A cell joined with its current revision and that revision's author. */
export interface CellRow {
  id: number;
  notebookId: string;
  kind: 'circuit' | 'note';
  position: number;
  revision: number;
  updatedAt: Date;
  deletedAt: Date | null;
  revisionId: number;
  text: string;
  diagnosticErrors: number | null;
  diagnosticWarnings: number | null;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  revisionCreatedAt: Date;
}

/** A revision with its author; `text` only when one revision is read, `size` in lists. */
export interface RevisionRow {
  cellId: number;
  number: number;
  text?: string;
  size?: number | string;
  diagnosticErrors: number | null;
  diagnosticWarnings: number | null;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  createdAt: Date;
}

export interface VersionRow {
  id: number;
  notebookId: string;
  number: number;
  label: string;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  createdAt: Date;
  cellCount: number | string;
}

export interface VersionCellRow {
  cellId: number;
  kind: 'circuit' | 'note';
  position: number;
  revision: number;
  text: string;
  diagnosticErrors: number | null;
  diagnosticWarnings: number | null;
}

export interface MemberRow {
  userId: number;
  login: string;
  name: string;
  role: 'owner' | 'editor' | 'reviewer' | 'viewer';
  addedAt: Date;
}
