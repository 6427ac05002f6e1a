/** The history of one cell, with its two chosen revisions overlaid by the circuit feature. */
import { cellName } from '@rolloff/api/contract';
import { useQueryClient } from '@tanstack/react-query';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { data, useParams } from 'react-router-dom';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { SubPage } from '../../components/ui/sub-page';
import { CellHistory } from '../../features/cells/components/cell-history';
import { RevisionOverlay } from '../../features/circuit/components/revision-overlay';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { appPaths } from '../../lib/paths';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { notebookIdOf } from '../route-params';
import { slugOf } from '../../lib/slug';
import { useDocumentTitle } from '../../hooks/use-document-title';

function cellIdOf(params: { cellId?: string }): number {
  const id = Number(params.cellId);
  if (!Number.isInteger(id) || id <= 0) throw data({ what: 'This cell' }, { status: 404 });
  return id;
}

export async function loader({ request, params }: LoaderFunctionArgs) {
  await requireMe(request);
  const id = notebookIdOf(params);
  const cellId = cellIdOf(params);
  const notebook = await orRouteError(queryClient.ensureQueryData(notebookQueryOptions(id)));
  if (![...notebook.cells, ...notebook.deletedCells].some((c) => c.id === cellId)) throw data({ what: 'This cell' }, { status: 404 });
  return null;
}

export function Component() {
  const params = useParams();
  const id = notebookIdOf(params);
  const cellId = cellIdOf(params);
  const notebook = useNotebook(id);
  useDocumentTitle('Cell history', notebook.data?.title);
  const client = useQueryClient();
  if (notebook.isPending) return <Loading />;
  if (notebook.isError) return <ErrorMessage error={notebook.error} retry={() => void notebook.refetch()} />;
  const cells = [...notebook.data.cells, ...notebook.data.deletedCells];
  const cell = cells.find((c) => c.id === cellId);
  if (!cell) return <ErrorMessage error={new Error('This cell is not in the notebook any more.')} />;
  const title = `History of ${cellName({ ...cell, deleted: cell.deletedAt !== null })}`;
  return (
    <SubPage backTo={appPaths.notebook(id)} backLabel={notebook.data.title} title={title}>
      <CellHistory
        notebookId={id}
        cellId={cellId}
        kind={cell.kind}
        editable={notebook.data.permissions.edit}
        renderOverlay={({ entries }) => (
          <RevisionOverlay entries={entries} cellKey={`${id}:${cellId}`} filename={`${slugOf(notebook.data.title)}-cell-history`} />
        )}
        onRestored={() => void client.invalidateQueries({ queryKey: notebookQueryOptions(id).queryKey, exact: true })}
      />
    </SubPage>
  );
}
