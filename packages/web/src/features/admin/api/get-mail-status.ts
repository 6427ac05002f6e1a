import { queryOptions, useQuery } from '@tanstack/react-query';
import { MailStatusSchema } from '@rolloff/api/contract';
import type { MailStatus } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Whether the mail relay answers, and the outbox's counts (admins only). */
export function getMailStatus(signal?: AbortSignal): Promise<MailStatus> {
  return apiRequest(apiPaths.adminMail(), MailStatusSchema, { signal });
}

export const mailStatusQueryOptions = () =>
  queryOptions({
    queryKey: ['admin', 'mail'] as const,
    queryFn: ({ signal }) => getMailStatus(signal),
    // The relay can go and come back while the page is open.
    refetchInterval: 30_000,
  });

export const useMailStatus = () => useQuery(mailStatusQueryOptions());
