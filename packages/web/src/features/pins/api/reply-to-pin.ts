import { useMutation, useQueryClient } from '@tanstack/react-query';
import { PinSchema } from '@rolloff/api/contract';
import type { Pin, PinCommentCreate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { pinListQueryOptions, withPin } from './list-pins';

/** Adds a reply to a pin's thread; the answer is the pin with its whole thread. */
export function replyToPin(notebookId: string, pinId: number, body: PinCommentCreate): Promise<Pin> {
  return apiRequest(apiPaths.pinComments(notebookId, pinId), PinSchema, { method: 'POST', body });
}

export const useReplyToPin = (notebookId: string) => {
  const client = useQueryClient();
  return useMutation({
    mutationFn: ({ pinId, body }: { pinId: number; body: PinCommentCreate }) => replyToPin(notebookId, pinId, body),
    onSuccess: (pin) => client.setQueryData(pinListQueryOptions(notebookId).queryKey, (list) => withPin(list, pin)),
  });
};
