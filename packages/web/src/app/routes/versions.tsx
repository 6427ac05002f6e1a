import type { LoaderFunctionArgs } from 'react-router-dom';
import { Link, useParams } from 'react-router-dom';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { versionListQueryOptions } from '../../features/notebooks/api/list-versions';
import { VersionsPanel } from '../../features/notebooks/components/versions-panel';
import { appPaths } from '../../lib/paths';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { notebookIdOf } from './notebook';

export async function loader({ request, params }: LoaderFunctionArgs) {
  await requireMe(request);
  const id = notebookIdOf(params);
  await orRouteError(Promise.all([queryClient.ensureQueryData(notebookQueryOptions(id)), queryClient.ensureQueryData(versionListQueryOptions(id))]));
  return null;
}

/** The versions of a notebook. */
export function Component() {
  const id = notebookIdOf(useParams());
  const notebook = useNotebook(id);
  if (notebook.isPending) return <Loading />;
  if (notebook.isError) return <ErrorMessage error={notebook.error} retry={() => void notebook.refetch()} />;
  return (
    <section className="space-y-6">
      <div>
        <p className="text-sm">
          <Link to={appPaths.notebook(id)} className="text-accent underline-offset-2 hover:underline">
            ← {notebook.data.title}
          </Link>
        </p>
        <h1 className="text-2xl font-semibold tracking-tight">Versions</h1>
        <p className="text-ink-soft">A version keeps every cell as it was, read-only, for a review or to fork from.</p>
      </div>
      <VersionsPanel notebookId={id} canCreate={notebook.data.permissions.edit} />
    </section>
  );
}
