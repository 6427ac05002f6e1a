/**
 * Review states as screens name them (product.md: *requested*, *needs changes*, *signed
 * off*), and what the signed-in person may still decide in a round.
 */
import type { Review, ReviewState } from '@rolloff/api/contract';

export const REVIEW_STATE_WORDS: Record<ReviewState, string> = {
  requested: 'requested',
  needs_changes: 'needs changes',
  signed_off: 'signed off',
};

/**
 * Where the signed-in person stands in a round: not asked; asked, but the round is
 * superseded by a later one; signed off already (final for the round); or free to decide
 * (first decision, or a sign-off after asking for changes).
 */
export type MyDecision = { kind: 'not-asked' } | { kind: 'superseded' } | { kind: 'signed-off' } | { kind: 'open'; state: 'requested' | 'needs_changes' };

/** What `meId` may still decide in `review`. */
export function myDecision(review: Review, meId: number): MyDecision {
  const mine = review.reviewers.find((r) => r.user.id === meId);
  if (!mine) return { kind: 'not-asked' };
  if (review.superseded) return { kind: 'superseded' };
  if (mine.state === 'signed_off') return { kind: 'signed-off' };
  return { kind: 'open', state: mine.state };
}
