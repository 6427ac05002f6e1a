import type { Review, ReviewState, ReviewStatus } from '../contract/reviews.js';
import { iso, isoOrNull, presentAuthor } from './common.js';
import { presentVersionRef } from './version.js';
import type { AssignmentRow, DecisionRow, ReviewRow } from '../services/reviews.js';

/**
 * A round's state from its reviewers' states: any request for changes wins, then a round
 * is signed off only when every reviewer signed off; otherwise it is still requested.
 */
export function roundState(states: readonly ReviewState[]): ReviewState {
  if (states.includes('needs_changes')) return 'needs_changes';
  if (states.length > 0 && states.every((state) => state === 'signed_off')) return 'signed_off';
  return 'requested';
}

export function presentReview(row: ReviewRow, assignments: AssignmentRow[], decisions: DecisionRow[]): Review {
  return {
    id: row.id,
    notebookId: row.notebookId,
    round: row.round,
    version: presentVersionRef({ number: row.versionNumber, label: row.versionLabel }),
    requestedBy: presentAuthor(row.requestedById, row.requestedByLogin, row.requestedByName),
    message: row.message,
    createdAt: iso(row.createdAt),
    state: roundState(assignments.map((a) => a.state)),
    superseded: row.round < Number(row.latestRound),
    reviewers: assignments.map((a) => ({
      user: { id: a.reviewerId, login: a.login, name: a.name },
      state: a.state,
      summary: a.summary,
      decidedAt: isoOrNull(a.decidedAt),
    })),
    history: decisions.map((d) => ({
      reviewer: presentAuthor(d.reviewerId, d.login, d.name),
      state: d.state,
      summary: d.summary,
      createdAt: iso(d.createdAt),
    })),
  };
}

export function presentReviewStatus(row: Pick<ReviewRow, 'id' | 'round' | 'versionNumber'>, states: readonly ReviewState[]): ReviewStatus {
  return { reviewId: row.id, round: row.round, state: roundState(states), versionNumber: row.versionNumber };
}
