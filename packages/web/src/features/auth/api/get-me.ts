import { queryOptions, useQuery } from '@tanstack/react-query';
import { MeSchema } from '@rolloff/api/contract';
import type { Me } from '@rolloff/api/contract';
import { ApiError, apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** The signed-in person, or null when nobody is signed in. */
export async function getMe(signal?: AbortSignal): Promise<Me | null> {
  try {
    return await apiRequest(apiPaths.me(), MeSchema, { signal, quietUnauthenticated: true });
  } catch (error) {
    if (error instanceof ApiError && error.status === 401) return null;
    throw error;
  }
}

export const meQueryOptions = () =>
  queryOptions({
    queryKey: ['me'],
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });

export const useMe = () => useQuery(meQueryOptions());
