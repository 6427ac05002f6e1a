import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ReviewSchema } from '@rolloff/api/contract';
import type { Review, ReviewDecisionCreate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { reviewQueryOptions } from './get-review';
import { reviewListQueryOptions } from './list-reviews';

/** An assigned reviewer asks for changes (with a summary) or signs off. */
export function decideReview(notebookId: string, reviewId: number, body: ReviewDecisionCreate): Promise<Review> {
  return apiRequest(apiPaths.reviewDecision(notebookId, reviewId), ReviewSchema, { method: 'POST', body });
}

/** `onDecided` lets the page refresh what a decision changes elsewhere (the header's state). */
export const useDecideReview = (notebookId: string, reviewId: number, onDecided?: (review: Review) => void) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: ReviewDecisionCreate) => decideReview(notebookId, reviewId, body),
    onSuccess: (review) => {
      client.setQueryData(reviewQueryOptions(notebookId, reviewId).queryKey, review);
      void client.invalidateQueries({ queryKey: reviewListQueryOptions(notebookId).queryKey, exact: true });
      onDecided?.(review);
    },
  });
};
