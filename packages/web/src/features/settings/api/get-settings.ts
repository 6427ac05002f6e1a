import { queryOptions, useQuery } from '@tanstack/react-query';
import { SettingsSchema } from '@rolloff/api/contract';
import type { Settings } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** The signed-in person's settings: which e-mails they want. */
export function getSettings(signal?: AbortSignal): Promise<Settings> {
  return apiRequest(apiPaths.settings(), SettingsSchema, { signal });
}

// Not under ['me']: a lost session invalidates ['me'], and this query would then ask again
// with no session, report the 401 again, and so on.
export const settingsQueryOptions = () =>
  queryOptions({
    queryKey: ['settings'] as const,
    queryFn: ({ signal }) => getSettings(signal),
  });

export const useSettings = () => useQuery(settingsQueryOptions());
