import { queryOptions, useQuery } from '@tanstack/react-query';
import { ReviewSchema } from '@rolloff/api/contract';
import type { Review } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { reviewListQueryOptions } from './list-reviews';

/** One review round: its version, the people asked, their states and every decision. */
export function getReview(notebookId: string, reviewId: number, signal?: AbortSignal): Promise<Review> {
  return apiRequest(apiPaths.review(notebookId, reviewId), ReviewSchema, { signal });
}

export const reviewQueryOptions = (notebookId: string, reviewId: number) =>
  queryOptions({
    queryKey: [...reviewListQueryOptions(notebookId).queryKey, reviewId] as const,
    queryFn: ({ signal }) => getReview(notebookId, reviewId, signal),
  });

export const useReview = (notebookId: string, reviewId: number) => useQuery(reviewQueryOptions(notebookId, reviewId));
