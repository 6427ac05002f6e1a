import { queryOptions, useQuery } from '@tanstack/react-query';
import { ReviewListSchema } from '@rolloff/api/contract';
import type { ReviewList } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Every review round of a notebook, newest first. */
export function listReviews(notebookId: string, signal?: AbortSignal): Promise<ReviewList> {
  return apiRequest(apiPaths.reviews(notebookId), ReviewListSchema, { signal });
}

export const reviewListQueryOptions = (notebookId: string) =>
  queryOptions({
    queryKey: ['notebooks', notebookId, 'reviews'] as const,
    queryFn: ({ signal }) => listReviews(notebookId, signal),
  });

export const useReviewList = (notebookId: string) => useQuery(reviewListQueryOptions(notebookId));
