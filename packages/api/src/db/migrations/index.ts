import { CreateUsers1764633600000 } from './1764633600000-create-users.js';
import { CreateAppState1764633600001 } from './1764633600001-create-app-state.js';
import { AddUserSignIn1764633600002 } from './1764633600002-add-user-sign-in.js';
import { CreateSessions1764633600003 } from './1764633600003-create-sessions.js';
import { CreateNotebooks1764633600004 } from './1764633600004-create-notebooks.js';
import { CreateCells1764633600005 } from './1764633600005-create-cells.js';
import { CreateVersions1764633600006 } from './1764633600006-create-versions.js';
import { CreateReviewsAndPins1764633600007 } from './1764633600007-create-reviews-and-pins.js';
import { CreateMail1764633600008 } from './1764633600008-create-mail.js';
import { AddNotebookDescription1764633600009 } from './1764633600009-add-notebook-description.js';
import { AddNotebookSortKeys1764633600010 } from './1764633600010-add-notebook-sort-keys.js';
import { RenameChangesAsked1764633600011 } from './1764633600011-rename-changes-asked.js';
import { AddRevisionMessage1764633600012 } from './1764633600012-add-revision-message.js';
import { LanguageUpdate1764633600013 } from './1764633600013-language-update.js';
import { AddCellTitle1764633600014 } from './1764633600014-add-cell-title.js';
import { CreateMailOutbox1764633600030 } from './1764633600030-create-mail-outbox.js';
import { CreateRateLimits1764633600031 } from './1764633600031-create-rate-limits.js';
import { CreateIdempotencyKeys1764633600040 } from './1764633600040-create-idempotency-keys.js';

/**
 * Every migration, oldest first. Listed by class rather than found by a file glob, so the
 * same DataSource works built, under tsx and under Vitest. Add a new migration here.
 */
export const migrations = [
  CreateUsers1764633600000,
  CreateAppState1764633600001,
  AddUserSignIn1764633600002,
  CreateSessions1764633600003,
  CreateNotebooks1764633600004,
  CreateCells1764633600005,
  CreateVersions1764633600006,
  CreateReviewsAndPins1764633600007,
  CreateMail1764633600008,
  AddNotebookDescription1764633600009,
  AddNotebookSortKeys1764633600010,
  RenameChangesAsked1764633600011,
  AddRevisionMessage1764633600012,
  LanguageUpdate1764633600013,
  AddCellTitle1764633600014,
  CreateMailOutbox1764633600030,
  CreateRateLimits1764633600031,
  CreateIdempotencyKeys1764633600040,
];
