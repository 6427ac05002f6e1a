/** A notebook's activity: saves, versions, forks, pins and review states, newest first. */
import type { LoaderFunctionArgs } from 'react-router-dom';
import { useParams } from 'react-router-dom';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { SubPage } from '../../components/ui/sub-page';
import { activityQueryOptions } from '../../features/activity/api/list-activity';
import { ActivityTimeline } from '../../features/activity/components/activity-timeline';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { appPaths } from '../../lib/paths';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { cellNamer, notebookIdOf } from '../route-params';
import { useDocumentTitle } from '../../hooks/use-document-title';

export async function loader({ request, params }: LoaderFunctionArgs) {
  await requireMe(request);
  const id = notebookIdOf(params);
  await orRouteError(Promise.all([queryClient.ensureQueryData(notebookQueryOptions(id)), queryClient.prefetchInfiniteQuery(activityQueryOptions(id))]));
  return null;
}

export function Component() {
  const id = notebookIdOf(useParams());
  const notebook = useNotebook(id);
  useDocumentTitle('Activity', notebook.data?.title);
  if (notebook.isPending) return <Loading />;
  if (notebook.isError) return <ErrorMessage error={notebook.error} retry={() => void notebook.refetch()} />;
  return (
    <SubPage
      backTo={appPaths.notebook(id)}
      backLabel={notebook.data.title}
      title="Activity"
      intro="Saves, versions, forks, pins and reviews of this notebook, newest first."
    >
      <ActivityTimeline notebookId={id} cellName={cellNamer(notebook.data.cells)} />
    </SubPage>
  );
}
