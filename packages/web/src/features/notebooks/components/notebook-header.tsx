/**
 * The top of a notebook page: title, description, owner and the caller's role, where it was
 * forked from, and the actions the caller's role allows (Share, Fork, Versions, Delete). The
 * page adds what other features show there (the review state, asking for a review) through
 * slots.
 */
import type { Notebook } from '@rolloff/api/contract';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Button, buttonClass } from '../../../components/ui/button';
import { RoleBadge } from '../../../components/ui/role-badge';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { appPaths } from '../../../lib/paths';
import { NotebookDescription } from './notebook-description';
import { NotebookTitle } from './notebook-title';

export interface NotebookHeaderProps {
  notebook: Notebook;
  onShare: () => void;
  onFork: () => void;
  forking: boolean;
  onDelete: () => void;
  deleting: boolean;
  /** Shown after the notebook's facts, e.g. the latest review's state. */
  status?: ReactNode;
  /** More actions, placed before Versions. */
  actions?: ReactNode;
}

/** Where a fork came from, linked when the caller may open it. */
export function ForkOrigin({ notebook }: { notebook: Notebook }) {
  const origin = notebook.forkedFrom;
  if (!origin) return null;
  const version = origin.version ? ` (version ${origin.version.number}, “${origin.version.label}”)` : '';
  return (
    <p className="text-sm text-ink-soft" data-testid="forked-from">
      Forked from{' '}
      {origin.notebook ? (
        <Link to={appPaths.notebook(origin.notebook.id)} className="text-accent underline-offset-2 hover:underline">
          {origin.notebook.title}
        </Link>
      ) : (
        <span>a notebook you cannot open</span>
      )}
      {version}
    </p>
  );
}

/** The header of a notebook page. */
export function NotebookHeader({ notebook, onShare, onFork, forking, onDelete, deleting, status, actions }: NotebookHeaderProps) {
  const { permissions } = notebook;
  return (
    <header className="space-y-2 border-b border-rule pb-4">
      {/* Below extra-large widths (or at 200 % zoom) the actions go under the title, not beside it. */}
      <div className="flex flex-col gap-3 xl:flex-row xl:items-start xl:justify-between">
        <div className="min-w-0 flex-1 space-y-1">
          <NotebookTitle notebook={notebook} />
          <NotebookDescription notebook={notebook} />
          <p className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
            <span>by {notebook.owner.name || notebook.owner.login}</span>
            <span aria-hidden>·</span>
            <span className="flex items-center gap-1" data-testid="my-role">
              your role <RoleBadge role={notebook.role} />
            </span>
            <span aria-hidden>·</span>
            <span title={exactTime(notebook.updatedAt)}>changed {timeAgo(notebook.updatedAt)}</span>
            {notebook.visibility === 'link' ? (
              <>
                <span aria-hidden>·</span>
                <span>link sharing on</span>
              </>
            ) : null}
            {status}
          </p>
          <ForkOrigin notebook={notebook} />
        </div>
        <nav aria-label="Notebook actions" className="flex flex-wrap gap-2">
          {permissions.share ? (
            <Button onClick={onShare} data-testid="share">
              Share
            </Button>
          ) : null}
          {permissions.fork ? (
            <Button onClick={onFork} disabled={forking} data-testid="fork">
              {forking ? 'Forking…' : 'Fork'}
            </Button>
          ) : null}
          {actions}
          <Link to={appPaths.versions(notebook.id)} className={buttonClass('secondary')}>
            Versions
          </Link>
          {permissions.delete ? (
            <Button variant="danger" onClick={onDelete} disabled={deleting}>
              Delete
            </Button>
          ) : null}
        </nav>
      </div>
      {!permissions.edit ? (
        <p className="rounded-md bg-sunken px-3 py-1.5 text-sm text-ink-soft" data-testid="read-only-note">
          You can read this notebook{permissions.fork ? ' and fork it to try changes of your own' : ''}; your role does not allow editing it.
        </p>
      ) : null}
    </header>
  );
}
