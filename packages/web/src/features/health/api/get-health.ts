import { queryOptions, useQuery } from '@tanstack/react-query';
import { HealthSchema } from '@rolloff/api/contract';
import type { Health } from '@rolloff/api/contract';
import { apiPaths } from '../../../lib/paths';

/** Reads /api/health; a 503 still carries a health body (db down), so it is not an error. */
export async function getHealth(signal?: AbortSignal): Promise<Health> {
  const response = await fetch(apiPaths.health(), { signal, headers: { accept: 'application/json' } });
  if (!response.ok && response.status !== 503) throw new Error(`The server answered ${response.status}.`);
  return HealthSchema.parse(await response.json());
}

export const healthQueryOptions = () =>
  queryOptions({
    queryKey: ['health'],
    queryFn: ({ signal }) => getHealth(signal),
    refetchInterval: 15_000,
  });

export const useHealth = () => useQuery(healthQueryOptions());
