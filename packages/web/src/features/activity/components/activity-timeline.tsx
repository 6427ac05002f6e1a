/**
 * A notebook's timeline, newest first: saves (cell revisions), versions, forks, pins and
 * replies, and review states, each linked to where it can be read. Pages in as asked.
 */
import type { ActivityItem } from '@rolloff/api/contract';
import { formatSi } from '@rolloff/solver';
import type { ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { EmptyState, ErrorMessage, Loading } from '../../../components/ui/status-message';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { appPaths } from '../../../lib/paths';
import { useActivity } from '../api/list-activity';

export interface ActivityTimelineProps {
  notebookId: string;
  /** Where a cell is in the notebook, e.g. "circuit cell 2" (or "a deleted cell"). */
  cellName: (cellId: number) => string;
}

const linkClass = 'text-accent underline-offset-2 hover:underline';

/** What happened, in words, with links. */
function describe(item: ActivityItem, notebookId: string, cellName: (cellId: number) => string): ReactNode {
  switch (item.kind) {
    case 'revision':
      return item.revisionNumber === 1 ? (
        <>added {cellName(item.cell.id)}</>
      ) : (
        <>
          saved revision {item.revisionNumber} of{' '}
          <Link className={linkClass} to={appPaths.cellHistory(notebookId, item.cell.id)}>
            {cellName(item.cell.id)}
          </Link>
          {item.message ? ` (${item.message})` : null}
        </>
      );
    case 'version':
      return (
        <>
          made{' '}
          <Link className={linkClass} to={appPaths.version(notebookId, item.version.number)}>
            version {item.version.number} “{item.version.label}”
          </Link>
        </>
      );
    case 'fork':
      return item.fork ? (
        <>
          forked it as{' '}
          <Link className={linkClass} to={appPaths.notebook(item.fork.id)}>
            {item.fork.title}
          </Link>
        </>
      ) : (
        <>forked it</>
      );
    case 'pin':
    case 'comment':
    case 'pin_resolved': {
      const what = { pin: 'pinned a comment', comment: 'replied on the pin', pin_resolved: 'resolved the pin' }[item.kind];
      return (
        <>
          {what} at{' '}
          <Link className={linkClass} to={appPaths.pin(notebookId, item.pin.id)}>
            {formatSi(item.pin.frequency, 'Hz')} on {item.pin.trace}
          </Link>{' '}
          ({cellName(item.pin.cellId)}, revision {item.pin.revisionNumber})
          {'excerpt' in item && item.excerpt ? <span className="block text-ink-soft">“{item.excerpt}”</span> : null}
        </>
      );
    }
    case 'review_requested':
      return (
        <>
          asked {item.reviewers.map((r) => r.name || r.login).join(', ')} to{' '}
          <Link className={linkClass} to={appPaths.review(notebookId, item.review.id)}>
            review version {item.review.versionNumber}
          </Link>{' '}
          (round {item.review.round}){item.excerpt ? <span className="block text-ink-soft">“{item.excerpt}”</span> : null}
        </>
      );
    case 'review_decision':
      return (
        <>
          {item.state === 'signed_off' ? 'signed off' : 'asked for changes to'}{' '}
          <Link className={linkClass} to={appPaths.review(notebookId, item.review.id)}>
            version {item.review.versionNumber}
          </Link>{' '}
          (round {item.review.round}){item.excerpt ? <span className="block text-ink-soft">“{item.excerpt}”</span> : null}
        </>
      );
  }
}

/** The timeline with "Show older" for the next page. */
export function ActivityTimeline({ notebookId, cellName }: ActivityTimelineProps) {
  const activity = useActivity(notebookId);
  if (activity.isPending) return <Loading text="Loading the activity…" />;
  // A failed "Show older" keeps the pages already shown and says what went wrong under them.
  if (activity.isError && !activity.data) return <ErrorMessage error={activity.error} retry={() => void activity.refetch()} />;
  const items = activity.data.pages.flatMap((page) => page.items);
  if (items.length === 0) return <EmptyState title="Nothing has happened yet" />;
  return (
    <div className="space-y-4">
      <ol className="divide-y divide-rule rounded-xl border border-rule bg-panel" data-testid="activity">
        {items.map((item) => (
          <li key={item.id} className="flex flex-wrap gap-x-3 gap-y-1 px-4 py-2.5 text-sm" data-kind={item.kind}>
            <time dateTime={item.at} title={exactTime(item.at)} className="w-28 shrink-0 text-ink-faint">
              {timeAgo(item.at)}
            </time>
            <p className="min-w-0 flex-1">
              <span className="font-medium">{item.actor ? item.actor.name || item.actor.login : 'Someone'}</span> {describe(item, notebookId, cellName)}
            </p>
          </li>
        ))}
      </ol>
      {activity.isError ? <ErrorMessage error={activity.error} retry={() => void activity.fetchNextPage()} /> : null}
      {activity.hasNextPage ? (
        <Button onClick={() => void activity.fetchNextPage()} disabled={activity.isFetchingNextPage}>
          {activity.isFetchingNextPage ? 'Loading…' : 'Show older'}
        </Button>
      ) : null}
    </div>
  );
}
