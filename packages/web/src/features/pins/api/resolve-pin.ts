import { useMutation, useQueryClient } from '@tanstack/react-query';
import { PinSchema } from '@rolloff/api/contract';
import type { Pin } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { pinListQueryOptions, withPin } from './list-pins';

/** Marks a pin resolved; resolving a resolved pin changes nothing. */
export function resolvePin(notebookId: string, pinId: number): Promise<Pin> {
  return apiRequest(apiPaths.pinResolve(notebookId, pinId), PinSchema, { method: 'POST' });
}

export const useResolvePin = (notebookId: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (pinId: number) => resolvePin(notebookId, pinId),
    onSuccess: (pin) => client.setQueryData(pinListQueryOptions(notebookId).queryKey, (list) => withPin(list, pin)),
  });
};
