/** A notebook's activity: saves, versions, forks, pins and review states, newest first. */
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Link, useParams } from 'react-router-dom';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { activityQueryOptions } from '../../features/activity/api/list-activity';
import { ActivityTimeline } from '../../features/activity/components/activity-timeline';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { appPaths } from '../../lib/paths';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { cellNamer, notebookIdOf } from './notebook';

export async function loader({ request, params }: LoaderFunctionArgs) {
  await requireMe(request);
  const id = notebookIdOf(params);
  await orRouteError(Promise.all([queryClient.ensureQueryData(notebookQueryOptions(id)), queryClient.prefetchInfiniteQuery(activityQueryOptions(id))]));
  return null;
}

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
        <h1 className="text-2xl font-semibold tracking-tight">Activity</h1>
        <p className="text-ink-soft">Saves, versions, forks, pins and reviews of this notebook, newest first.</p>
      </div>
      <ActivityTimeline notebookId={id} cellName={cellNamer(notebook.data.cells)} />
    </section>
  );
}
