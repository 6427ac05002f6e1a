import { Cell } from './cell.js';
import { CellRevision } from './cell-revision.js';
import { MailLogEntry } from './mail-log-entry.js';
import { MailOutboxEntry } from './mail-outbox-entry.js';
import { Notebook } from './notebook.js';
import { NotebookMember } from './notebook-member.js';
import { NotebookVersion, NotebookVersionCell } from './notebook-version.js';
import { Pin, PinComment } from './pin.js';
import { RateLimitCounter } from './rate-limit-counter.js';
import { Review, ReviewAssignment, ReviewDecision } from './review.js';
import { Session } from './session.js';
import { User } from './user.js';
import { UserMailSettings } from './user-mail-settings.js';

/** Every entity the DataSource knows. */
export const entities = [
  User,
  Session,
  Notebook,
  NotebookMember,
  Cell,
  CellRevision,
  NotebookVersion,
  NotebookVersionCell,
  Review,
  ReviewAssignment,
  ReviewDecision,
  Pin,
  PinComment,
  UserMailSettings,
  MailLogEntry,
  MailOutboxEntry,
  RateLimitCounter,
];

export {
  Cell,
  CellRevision,
  MailLogEntry,
  MailOutboxEntry,
  Notebook,
  NotebookMember,
  NotebookVersion,
  NotebookVersionCell,
  Pin,
  PinComment,
  RateLimitCounter,
  Review,
  ReviewAssignment,
  ReviewDecision,
  Session,
  User,
  UserMailSettings,
};
