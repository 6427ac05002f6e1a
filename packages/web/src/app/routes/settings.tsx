/** The signed-in person's settings: which e-mails Rolloff sends them. */
import type { LoaderFunctionArgs } from 'react-router-dom';
import { MailSettingsForm } from '../../features/settings/components/mail-settings-form';
import { settingsQueryOptions } from '../../features/settings/api/get-settings';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { useDocumentTitle } from '../../hooks/use-document-title';

export async function loader({ request }: LoaderFunctionArgs) {
  await requireMe(request);
  await orRouteError(queryClient.ensureQueryData(settingsQueryOptions()), 'Your settings');
  return null;
}

export function Component() {
  useDocumentTitle('Settings');
  return (
    <section className="max-w-2xl space-y-6">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">Settings</h1>
        <p className="text-ink-soft">Rolloff e-mails you when something needs you. Turn off what you would rather not get.</p>
      </div>
      <MailSettingsForm />
    </section>
  );
}
