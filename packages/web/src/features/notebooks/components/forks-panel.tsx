import { Link } from 'react-router-dom';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { appPaths } from '../../../lib/paths';
import { useForkList } from '../api/list-forks';

/** The forks of a notebook that the caller may open. */
export function ForksPanel({ notebookId, forkCount }: { notebookId: string; forkCount: number }) {
  const forks = useForkList(notebookId);
  if (forkCount === 0) return null;
  return (
    <section aria-label="Forks" className="rounded-xl border border-rule bg-panel p-4" data-testid="forks">
      <h2 className="mb-2 text-sm font-semibold text-ink-soft" data-testid="fork-count" data-count={forks.data?.total ?? forkCount}>
        Forks ({forks.data?.total ?? forkCount})
      </h2>
      {forks.isPending ? <p className="text-sm text-ink-faint">Loading the forks…</p> : null}
      {forks.isError ? <p className="text-sm text-fail">{forks.error.message}</p> : null}
      <ul className="space-y-1 text-sm">
        {forks.data?.items.map((fork) => (
          <li key={fork.id}>
            <Link to={appPaths.notebook(fork.id)} className="font-medium text-accent underline-offset-2 hover:underline">
              {fork.title}
            </Link>{' '}
            <span className="text-ink-faint" title={exactTime(fork.createdAt)}>
              by {fork.owner.name || fork.owner.login}, {timeAgo(fork.createdAt)}
              {fork.fromVersion ? ` from version ${fork.fromVersion.number}` : ''}
            </span>
          </li>
        ))}
      </ul>
      {forks.data && forks.data.total > forks.data.items.length ? (
        <p className="mt-1 text-xs text-ink-faint" data-testid="private-forks">
          {forks.data.total - forks.data.items.length === 1 ? 'One fork is' : `${forks.data.total - forks.data.items.length} forks are`} private to its owner;
          ask them to share it.
        </p>
      ) : null}
    </section>
  );
}
