import type { LoaderFunctionArgs } from 'react-router-dom';
import { data, useLoaderData } from 'react-router-dom';
import { MailStatusPanel } from '../../features/admin/components/mail-status';
import { UsersTable } from '../../features/admin/components/users-table';
import { requireMe } from '../loaders';
import { useDocumentTitle } from '../../hooks/use-document-title';

export async function loader({ request }: LoaderFunctionArgs) {
  const me = await requireMe(request);
  if (me.siteRole !== 'admin') {
    throw data({ what: 'The people page', message: 'Only site admins manage who may sign in; ask one of them for a change.' }, { status: 403 });
  }
  return { meId: me.id };
}

/** Site users for admins, and how outgoing mail goes. */
export function Component() {
  useDocumentTitle('People');
  const { meId } = useLoaderData<typeof loader>();
  return (
    <section className="space-y-6">
      <div>
        <h1 className="text-2xl font-semibold tracking-tight">People</h1>
        <p className="text-ink-soft">Who may sign in, and who is an admin.</p>
      </div>
      <UsersTable meId={meId} />
      <div>
        <h2 className="text-lg font-semibold tracking-tight">Outgoing mail</h2>
        <p className="text-ink-soft">Mail is kept until the relay takes it; a permanent refusal is not retried.</p>
      </div>
      <MailStatusPanel />
    </section>
  );
}
