import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ReviewSchema } from '@rolloff/api/contract';
import type { Review, ReviewCreate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { reviewQueryOptions } from './get-review';
import { reviewListQueryOptions } from './list-reviews';

/**
 * Asks members to review a version; without `versionNumber` the server reviews the latest
 * version, or makes a new one first when the notebook changed since.
 */
export function requestReview(notebookId: string, body: ReviewCreate): Promise<Review> {
  return apiRequest(apiPaths.reviews(notebookId), ReviewSchema, { method: 'POST', body });
}

/** `onRequested` lets the page refresh what a request changes elsewhere (header, versions). */
export const useRequestReview = (notebookId: string, onRequested?: (review: Review) => void) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: ReviewCreate) => requestReview(notebookId, body),
    onSuccess: (review) => {
      client.setQueryData(reviewQueryOptions(notebookId, review.id).queryKey, review);
      void client.invalidateQueries({ queryKey: reviewListQueryOptions(notebookId).queryKey });
      onRequested?.(review);
    },
  });
};
