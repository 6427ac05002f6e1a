/** Small builders of review and pin contract objects for component tests. */
import type { Pin, Review, UserRef } from '@rolloff/api/contract';
import { ines, tobias } from './cells';

export const mara: UserRef = { id: 1, login: 'mara.lindqvist', name: 'Mara Lindqvist' };
export const kenji: UserRef = { id: 4, login: 'kenji.arai', name: 'Kenji Arai' };
export const reviewNotebookId = 'Nb1234567890';

/** Round 1 of a review of version 2, asked by Inês of Mara and Kenji; nobody has decided. */
export function buildReview(overrides: Partial<Review> = {}): Review {
  return {
    id: 31,
    notebookId: reviewNotebookId,
    round: 1,
    version: { number: 2, label: 'For review' },
    requestedBy: ines,
    message: 'Check the **phase margin** at full load.',
    createdAt: '2026-12-02T10:00:00.000Z',
    state: 'requested',
    superseded: false,
    reviewers: [
      { user: mara, state: 'requested', summary: '', decidedAt: null },
      { user: kenji, state: 'requested', summary: '', decidedAt: null },
    ],
    history: [],
    ...overrides,
  };
}

/** A pin by Mara on revision 2 of cell 7, with her comment. */
export function buildPin(overrides: Partial<Pin> = {}): Pin {
  return {
    id: 5,
    notebookId: reviewNotebookId,
    cellId: 7,
    revisionNumber: 2,
    currentRevisionNumber: 2,
    trace: 'loop out / inj',
    frequency: 27_000,
    createdBy: mara,
    createdAt: '2026-12-02T10:30:00.000Z',
    resolved: false,
    resolvedBy: null,
    resolvedAt: null,
    comments: [{ id: 50, author: mara, body: 'Is the **crossover** high enough here?', createdAt: '2026-12-02T10:30:00.000Z' }],
    ...overrides,
  };
}

export { ines, tobias };
