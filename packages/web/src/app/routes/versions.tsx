import type { LoaderFunctionArgs } from 'react-router-dom';
import { useParams } from 'react-router-dom';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { SubPage } from '../../components/ui/sub-page';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { versionListQueryOptions } from '../../features/notebooks/api/list-versions';
import { VersionsPanel } from '../../features/notebooks/components/versions-panel';
import { appPaths } from '../../lib/paths';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { notebookIdOf } from '../route-params';
import { useDocumentTitle } from '../../hooks/use-document-title';

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
  useDocumentTitle('Versions', notebook.data?.title);
  if (notebook.isPending) return <Loading />;
  if (notebook.isError) return <ErrorMessage error={notebook.error} retry={() => void notebook.refetch()} />;
  return (
    <SubPage
      backTo={appPaths.notebook(id)}
      backLabel={notebook.data.title}
      title="Versions"
      intro="A version keeps every cell as it was, read-only, for a review or to fork from."
    >
      <VersionsPanel notebookId={id} canCreate={notebook.data.permissions.edit} />
    </SubPage>
  );
}
