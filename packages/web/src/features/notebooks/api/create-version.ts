import { useMutation, useQueryClient } from '@tanstack/react-query';
import { VersionSchema } from '@rolloff/api/contract';
import type { Version, VersionCreate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { versionQueryOptions } from './get-version';
import { notebookListsKey } from './list-notebooks';
import { versionListQueryOptions } from './list-versions';

/** Labels a snapshot of every cell's current revision. */
export function createVersion(id: string, body: VersionCreate): Promise<Version> {
  return apiRequest(apiPaths.versions(id), VersionSchema, { method: 'POST', body });
}

export const useCreateVersion = (id: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: VersionCreate) => createVersion(id, body),
    onSuccess: (version) => {
      client.setQueryData(versionQueryOptions(id, version.number).queryKey, version);
      void client.invalidateQueries({ queryKey: versionListQueryOptions(id).queryKey, exact: true });
      // The lists show how many versions each notebook has.
      void client.invalidateQueries({ queryKey: notebookListsKey() });
    },
  });
};
