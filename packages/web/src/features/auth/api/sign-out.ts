import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';

/** Ends the session on the server. */
export async function signOut(): Promise<void> {
  await apiRequest(apiPaths.logout(), z.unknown(), { method: 'POST' });
}

/** Signs out and forgets everything cached for the person. */
export const useSignOut = () => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => client.clear(),
  });
};
