import { useMutation, useQueryClient } from '@tanstack/react-query';
import { PinSchema } from '@rolloff/api/contract';
import type { Pin, PinCreate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { pinListQueryOptions, withPin } from './list-pins';

/** Pins a comment to a cell revision, a trace of its plot and a frequency. */
export function createPin(notebookId: string, body: PinCreate): Promise<Pin> {
  return apiRequest(apiPaths.pins(notebookId), PinSchema, { method: 'POST', body });
}

export const useCreatePin = (notebookId: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: (body: PinCreate) => createPin(notebookId, body),
    onSuccess: (pin) => client.setQueryData(pinListQueryOptions(notebookId).queryKey, (list) => withPin(list, pin)),
  });
};
