import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SettingsSchema } from '@rolloff/api/contract';
import type { Settings, SettingsUpdate } from '@rolloff/api/contract';
import { apiRequest } from '../../../lib/api-client';
import { apiPaths } from '../../../lib/paths';
import { settingsQueryOptions } from './get-settings';

/** Turns kinds of e-mail on or off; the others stay as they are. */
export function updateSettings(body: SettingsUpdate): Promise<Settings> {
  return apiRequest(apiPaths.settings(), SettingsSchema, { method: 'PATCH', body });
}

/** Shows the change at once and puts it back if the server refuses it. */
export const useUpdateSettings = () => {
  const client = useQueryClient();
  const key = settingsQueryOptions().queryKey;
  return useMutation({
    mutationFn: updateSettings,
    onMutate: async (body) => {
      await client.cancelQueries({ queryKey: key });
      const before = client.getQueryData(key);
      if (before) client.setQueryData(key, { mail: { ...before.mail, ...body.mail } });
      return { before };
    },
    onError: (_error, _body, context) => {
      if (context?.before) client.setQueryData(key, context.before);
    },
    onSuccess: (settings) => client.setQueryData(key, settings),
  });
};
