/** The shapes of the rows the services read with SQL, before presenters turn them into JSON. */

export interface UserRefRow {
  id: number;
  login: string;
  name: string;
}

/** A notebook with its owner, the caller's member role and three counts. */
export interface NotebookRow {
  id: string;
  title: string;
  description: string;
  ownerId: number;
  ownerLogin: string;
  ownerName: string;
  visibility: 'private' | 'link';
  forkedFromId: string | null;
  forkedFromVersionId: number | null;
  memberRole: 'editor' | 'reviewer' | 'viewer' | null;
  cellCount: number | string;
  forkCount: number | string;
  versionCount: number | string;
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

/** A review round with its version, its requester, and the notebook's latest round number. */
export interface ReviewRow {
  id: number;
  notebookId: string;
  round: number;
  versionId: number;
  versionNumber: number;
  versionLabel: string;
  requestedById: number | null;
  requestedByLogin: string | null;
  requestedByName: string | null;
  message: string;
  createdAt: Date;
  latestRound: number | string;
}

/** A person asked in a round, with their current state. */
export interface AssignmentRow {
  reviewId: number;
  reviewerId: number;
  login: string;
  name: string;
  state: 'requested' | 'changes_asked' | 'signed_off';
  summary: string;
  decidedAt: Date | null;
}

/** A decision of a round's history, with its reviewer (null when gone). */
export interface DecisionRow {
  reviewId: number;
  reviewerId: number | null;
  login: string | null;
  name: string | null;
  state: 'changes_asked' | 'signed_off';
  summary: string;
  createdAt: Date;
}

/** A pin with its creator, who resolved it, and its cell's current revision number. */
export interface PinRow {
  id: number;
  notebookId: string;
  cellId: number;
  revisionNumber: number;
  currentRevisionNumber: number;
  trace: string;
  frequency: number;
  createdById: number | null;
  createdByLogin: string | null;
  createdByName: string | null;
  createdAt: Date;
  resolvedAt: Date | null;
  resolvedById: number | null;
  resolvedByLogin: string | null;
  resolvedByName: string | null;
}

/** One comment of a pin's thread, with its author. */
export interface PinCommentRow {
  id: number;
  pinId: number;
  authorId: number | null;
  authorLogin: string | null;
  authorName: string | null;
  body: string;
  createdAt: Date;
}
