/**
 * A review round as its side panel tells it: who asked and what for, each reviewer with
 * their state and summary, and every decision in order.
 */
import type { Review } from '@rolloff/api/contract';
import { MarkdownView } from '../../../components/ui/markdown-view';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { ReviewStateBadge } from './review-badge';
import { REVIEW_STATE_WORDS } from './review-state';

const nameOf = (user: { name: string; login: string } | null) => (user ? user.name || user.login : 'someone no longer here');

function When({ iso }: { iso: string }) {
  return (
    <time dateTime={iso} title={exactTime(iso)} className="text-ink-faint">
      {timeAgo(iso)}
    </time>
  );
}

/** The people asked in a round, with their states. */
export function ReviewersList({ review }: { review: Review }) {
  return (
    <ul className="space-y-2" data-testid="reviewers">
      {review.reviewers.map((reviewer) => (
        <li key={reviewer.user.id} className="space-y-1 text-sm" data-login={reviewer.user.login} data-state={reviewer.state}>
          <p className="flex flex-wrap items-center gap-2">
            <span className="font-medium">{nameOf(reviewer.user)}</span>
            <ReviewStateBadge state={reviewer.state} />
            {reviewer.decidedAt ? <When iso={reviewer.decidedAt} /> : null}
          </p>
          {reviewer.summary ? <MarkdownView text={reviewer.summary} compact /> : null}
        </li>
      ))}
    </ul>
  );
}

/** The round's history, oldest first: the request, then each decision. */
export function ReviewHistory({ review }: { review: Review }) {
  return (
    <ol className="space-y-3 border-l-2 border-rule pl-3 text-sm" data-testid="review-history">
      <li>
        <p>
          <span className="font-medium">{nameOf(review.requestedBy)}</span> asked {review.reviewers.map((r) => nameOf(r.user)).join(', ')} to review version{' '}
          {review.version.number} · <When iso={review.createdAt} />
        </p>
        {review.message ? <MarkdownView text={review.message} compact /> : null}
      </li>
      {review.history.map((decision, index) => (
        <li key={`${decision.createdAt}:${index}`} data-state={decision.state}>
          <p>
            <span className="font-medium">{nameOf(decision.reviewer)}</span> {decision.state === 'signed_off' ? 'signed off' : 'asked for changes'} ·{' '}
            <When iso={decision.createdAt} />
          </p>
          {decision.summary ? <MarkdownView text={decision.summary} compact /> : null}
        </li>
      ))}
    </ol>
  );
}

/** One line per round, for moving between rounds: "Round 2 · version 3 · needs changes". */
export function roundLine(review: Review): string {
  return `Round ${review.round} · version ${review.version.number} · ${REVIEW_STATE_WORDS[review.state]}`;
}
