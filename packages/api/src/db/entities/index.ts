import { Cell } from './cell.js';
import { CellRevision } from './cell-revision.js';
import { Notebook } from './notebook.js';
import { NotebookMember } from './notebook-member.js';
import { NotebookVersion, NotebookVersionCell } from './notebook-version.js';
import { Session } from './session.js';
import { User } from './user.js';

/** Every entity the DataSource knows. */
export const entities = [User, Session, Notebook, NotebookMember, Cell, CellRevision, NotebookVersion, NotebookVersionCell];

export { Cell, CellRevision, Notebook, NotebookMember, NotebookVersion, NotebookVersionCell, Session, User };
