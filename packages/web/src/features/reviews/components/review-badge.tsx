/** A review state as a small badge, and the notebook header's link to the latest round. */
import type { ReviewState, ReviewStatus } from '@rolloff/api/contract';
import { Link } from 'react-router-dom';
import { REVIEW_STATE_WORDS } from './review-state';

const TONES: Record<ReviewState, string> = {
  requested: 'bg-accent-soft text-accent',
  needs_changes: 'bg-warn-soft text-warn',
  signed_off: 'bg-pass-soft text-pass',
};

/** "requested", "needs changes" or "signed off", in its colour. */
export function ReviewStateBadge({ state }: { state: ReviewState }) {
  return (
    <span className={`inline-flex rounded-full px-2 py-0.5 text-xs font-semibold ${TONES[state]}`} data-testid="review-state" data-state={state}>
      {REVIEW_STATE_WORDS[state]}
    </span>
  );
}

/** The latest round in brief, linked to its review view: "Review: needs changes · version 2". */
export function ReviewStatusLink({ status, href }: { status: ReviewStatus; href: string }) {
  return (
    <Link
      to={href}
      className="inline-flex items-center gap-1.5 rounded-full border border-rule px-2 py-0.5 text-sm hover:bg-sunken"
      data-testid="review-status"
      data-state={status.state}
      data-version={status.versionNumber}
    >
      <span className="text-ink-soft">Review</span>
      <ReviewStateBadge state={status.state} />
      <span className="text-ink-soft">version {status.versionNumber}</span>
      {/* The name read out is the visible words, plus the round for those who cannot see the colour. */}
      <span className="sr-only">, round {status.round}</span>
    </Link>
  );
}
