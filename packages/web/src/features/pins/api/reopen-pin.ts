import { useMutation, useQueryClient } from '@tanstack/react-query';
import { PinSchema } from '@rolloff/api/contract';
import type { Pin } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { pinListQueryOptions, withPin } from './list-pins';

/** Opens a resolved pin again; reopening an open pin changes nothing. */
export function reopenPin(notebookId: string, pinId: number): Promise<Pin> {
  return apiRequest(apiPaths.pinReopen(notebookId, pinId), PinSchema, { method: 'POST' });
}

export const useReopenPin = (notebookId: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (pinId: number) => reopenPin(notebookId, pinId),
    onSuccess: (pin) => client.setQueryData(pinListQueryOptions(notebookId).queryKey, (list) => withPin(list, pin)),
  });
};
