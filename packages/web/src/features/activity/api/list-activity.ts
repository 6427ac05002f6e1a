import { infiniteQueryOptions, useInfiniteQuery } from '@tanstack/react-query';
import { ActivityPageSchema } from '@rolloff/api/contract';
import type { ActivityPage } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** One page of a notebook's timeline, newest first; `cursor` is the previous page's `nextCursor`. */
export function listActivity(notebookId: string, cursor?: string, signal?: AbortSignal): Promise<ActivityPage> {
  return apiRequest(apiPaths.activity(notebookId, cursor), ActivityPageSchema, { signal });
}

export const activityQueryOptions = (notebookId: string) =>
  infiniteQueryOptions({
    queryKey: ['notebooks', notebookId, 'activity'] as const,
    queryFn: ({ pageParam, signal }) => listActivity(notebookId, pageParam, signal),
    initialPageParam: undefined as string | undefined,
    getNextPageParam: (page) => page.nextCursor ?? undefined,
  });

export const useActivity = (notebookId: string) => useInfiniteQuery(activityQueryOptions(notebookId));
