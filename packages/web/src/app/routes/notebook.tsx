/**
 * The notebook page: header (with the latest review's state and "Ask for review"), cells
 * (circuit cells drawn by the circuit feature, with their pins), the pin threads, forks, and
 * the share dialog. Loaded lazily; its loader warms the notebook in the query cache, and
 * sends a review e-mail's link (`?review=N`) on to that review.
 */
import type { CellSaved, MemberRole, Notebook, Review, Visibility } from '@rolloff/api/contract';
import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useMemo, useState } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { Link, redirect, useLocation, useNavigate, useParams } from 'react-router-dom';
import { Button, buttonClass } from '../../components/ui/button';
import { Dialog } from '../../components/ui/dialog';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { useMe } from '../../features/auth/api/get-me';
import { CellList } from '../../features/cells/components/cell-list';
import type { CircuitBodyProps } from '../../features/cells/components/cell-list';
import { CircuitWorkbench } from '../../features/circuit/components/circuit-workbench';
import { useDeleteNotebook } from '../../features/notebooks/api/delete-notebook';
import { useForkNotebook } from '../../features/notebooks/api/fork-notebook';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { useRestoreNotebook } from '../../features/notebooks/api/restore-notebook';
import { useUpdateNotebook } from '../../features/notebooks/api/update-notebook';
import { ForksPanel } from '../../features/notebooks/components/forks-panel';
import { NotebookHeader } from '../../features/notebooks/components/notebook-header';
import { usePinList } from '../../features/pins/api/list-pins';
import { pinLabels, pinMarks } from '../../features/pins/components/pin-labels';
import { PinList } from '../../features/pins/components/pin-list';
import { ReviewStatusLink } from '../../features/reviews/components/review-badge';
import { RequestReviewDialog } from '../../features/reviews/components/request-review-dialog';
import type { ReviewCandidate } from '../../features/reviews/components/request-review-dialog';
import { useMemberList } from '../../features/sharing/api/list-members';
import { ShareDialog } from '../../features/sharing/components/share-dialog';
import { appPaths } from '../../lib/paths';
import { slugOf } from '../../lib/slug';
import { cellNamer, notebookIdOf } from '../route-params';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { useDocumentTitle } from '../../hooks/use-document-title';

export async function loader({ request, params }: LoaderFunctionArgs) {
  await requireMe(request);
  const id = notebookIdOf(params);
  const reviewId = Number(new URL(request.url).searchParams.get('review'));
  if (Number.isInteger(reviewId) && reviewId > 0) throw redirect(appPaths.review(id, reviewId));
  await orRouteError(queryClient.ensureQueryData(notebookQueryOptions(id)));
  return null;
}

/** The pin threads under the cells; a link to `#pin-N` (a pin e-mail's) opens that one. */
function PinsSection({ notebook }: { notebook: Notebook }) {
  const pins = usePinList(notebook.id);
  const location = useLocation();
  const focused = Number(/^#pin-(\d+)$/.exec(location.hash)?.[1] ?? NaN);
  const labels = useMemo(() => pinLabels(pins.data?.items ?? []), [pins.data]);
  if (pins.isPending) return <Loading text="Loading the pins…" />;
  if (pins.isError) return <ErrorMessage error={pins.error} retry={() => void pins.refetch()} />;
  if (pins.data.items.length === 0) return null;
  return (
    <section aria-labelledby="pins-heading" className="space-y-3">
      <h2 id="pins-heading" className="text-lg font-semibold">
        Pins
      </h2>
      <PinList
        notebookId={notebook.id}
        pins={pins.data.items}
        labels={labels}
        cellName={cellNamer(notebook.cells)}
        canComment={notebook.permissions.review && !notebook.deletedAt}
        focusedPinId={Number.isFinite(focused) ? focused : null}
      />
    </section>
  );
}

/** "Ask for review" and its dialog, for people who may edit. */
function AskForReview({ notebook, onShareFirst }: { notebook: Notebook; onShareFirst?: () => void }) {
  const [open, setOpen] = useState(false);
  const me = useMe();
  const members = useMemberList(notebook.id, open);
  const client = useQueryClient();
  const navigate = useNavigate();
  const candidates = useMemo<ReviewCandidate[] | null>(
    () => members.data?.items.filter((m) => m.role !== 'viewer' && m.user.id !== me.data?.id).map((m) => ({ user: m.user, role: m.role })) ?? null,
    [members.data, me.data],
  );
  const onRequested = useCallback(
    (review: Review) => {
      setOpen(false);
      // The header's state and the versions (one may have been made for the review) changed.
      void client.invalidateQueries({ queryKey: notebookQueryOptions(notebook.id).queryKey });
      navigate(appPaths.review(notebook.id, review.id));
    },
    [client, navigate, notebook.id],
  );
  return (
    <>
      <Button onClick={() => setOpen(true)} data-testid="ask-for-review">
        Ask for review
      </Button>
      <RequestReviewDialog
        notebookId={notebook.id}
        open={open}
        onClose={() => setOpen(false)}
        candidates={candidates}
        candidatesError={members.error}
        onRequested={onRequested}
        onShareFirst={
          onShareFirst
            ? () => {
                setOpen(false);
                onShareFirst();
              }
            : undefined
        }
      />
    </>
  );
}

function DeletedNotice({ notebook }: { notebook: Notebook }) {
  const restore = useRestoreNotebook();
  return (
    <div role="status" className="flex flex-wrap items-center gap-3 rounded-lg border border-warn bg-warn-soft px-4 py-2 text-sm">
      This notebook is deleted. Nothing in it is lost.
      {notebook.permissions.delete ? (
        <Button size="sm" variant="primary" disabled={restore.isPending} onClick={() => restore.mutate(notebook.id)}>
          Restore it
        </Button>
      ) : null}
    </div>
  );
}

function NotebookPage({ notebook }: { notebook: Notebook }) {
  useDocumentTitle(notebook.title);
  const client = useQueryClient();
  const navigate = useNavigate();
  // Open with the role offered first when adding someone; null while closed.
  const [sharing, setSharing] = useState<MemberRole | null>(null);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const fork = useForkNotebook(notebook.id);
  const remove = useDeleteNotebook(notebook.id);
  const update = useUpdateNotebook(notebook.id);
  const key = notebookQueryOptions(notebook.id).queryKey;
  const stem = slugOf(notebook.title);
  const pins = usePinList(notebook.id);
  const marksOf = useMemo(() => {
    const items = pins.data?.items ?? [];
    return pinMarks(items, pinLabels(items));
  }, [pins.data]);

  const refresh = useCallback(() => void client.invalidateQueries({ queryKey: key, exact: true }), [client, key]);
  const onSaved = useCallback(
    (saved: CellSaved) =>
      client.setQueryData(key, (old) =>
        old ? { ...old, updatedAt: saved.cell.updatedAt, cells: old.cells.map((c) => (c.id === saved.cell.id ? saved.cell : c)) } : old,
      ),
    [client, key],
  );
  const renderCircuit = useCallback(
    (props: CircuitBodyProps) => (
      <CircuitWorkbench
        // Pins sit on the saved revision; while the text differs they would point at nothing.
        pins={props.text === props.cell.text ? marksOf(props.cell.id, props.cell.revision) : undefined}
        cellKey={`${notebook.id}:${props.cell.id}`}
        text={props.text}
        onChange={props.onChange}
        readOnly={props.readOnly}
        label={props.label}
        filename={`${stem}-cell-${props.cell.position + 1}`}
        onLeave={props.onLeave}
        autoFocus={props.autoFocus}
        helpHref={appPaths.help()}
      />
    ),
    [notebook.id, stem, marksOf],
  );

  return (
    <div className="space-y-6">
      <NotebookHeader
        notebook={notebook}
        onShare={() => setSharing('viewer')}
        onFork={() => fork.mutate({}, { onSuccess: (copy) => navigate(appPaths.notebook(copy.id)) })}
        forking={fork.isPending}
        onDelete={() => setConfirmDelete(true)}
        deleting={remove.isPending}
        status={
          notebook.review ? (
            <>
              <span aria-hidden>·</span>
              <ReviewStatusLink status={notebook.review} href={appPaths.review(notebook.id, notebook.review.reviewId)} />
            </>
          ) : null
        }
        actions={
          <>
            {notebook.permissions.edit && !notebook.deletedAt ? (
              <AskForReview notebook={notebook} onShareFirst={notebook.permissions.share ? () => setSharing('reviewer') : undefined} />
            ) : null}
            <Link to={appPaths.activity(notebook.id)} className={buttonClass('secondary')}>
              Activity
            </Link>
          </>
        }
      />
      {fork.error ? <ErrorMessage error={fork.error} /> : null}
      {notebook.deletedAt ? <DeletedNotice notebook={notebook} /> : null}
      <CellList
        notebookId={notebook.id}
        cells={notebook.cells}
        deletedCells={notebook.deletedCells}
        editable={notebook.permissions.edit && !notebook.deletedAt}
        renderCircuit={renderCircuit}
        onChanged={refresh}
        onSaved={onSaved}
        historyHref={(cellId) => appPaths.cellHistory(notebook.id, cellId)}
      />
      <PinsSection notebook={notebook} />
      <ForksPanel notebookId={notebook.id} forkCount={notebook.forkCount} />
      {notebook.permissions.share ? (
        <ShareDialog
          notebookId={notebook.id}
          open={sharing !== null}
          initialRole={sharing ?? 'viewer'}
          onClose={() => setSharing(null)}
          canShare={notebook.permissions.share}
          visibility={notebook.visibility}
          onVisibilityChange={(visibility: Visibility) => update.mutate({ visibility })}
          visibilityBusy={update.isPending}
          link={`${window.location.origin}${appPaths.notebook(notebook.id)}`}
        />
      ) : null}
      <Dialog open={confirmDelete} title="Delete this notebook?" onClose={() => setConfirmDelete(false)}>
        <p className="text-sm text-ink-soft">It disappears from everyone's list. You can restore it later from “Deleted” in your notebooks.</p>
        {remove.error ? <ErrorMessage error={remove.error} /> : null}
        <div className="mt-4 flex justify-end gap-2">
          <Button onClick={() => setConfirmDelete(false)}>Keep it</Button>
          <Button
            variant="danger"
            disabled={remove.isPending}
            onClick={() => remove.mutate(undefined, { onSuccess: () => navigate(`${appPaths.notebooks()}?scope=deleted`) })}
          >
            Delete notebook
          </Button>
        </div>
      </Dialog>
    </div>
  );
}

/** The route's component: reads the notebook the loader warmed. */
export function Component() {
  const id = notebookIdOf(useParams());
  const notebook = useNotebook(id);
  if (notebook.isPending) return <Loading text="Opening the notebook…" />;
  if (notebook.isError) return <ErrorMessage error={notebook.error} retry={() => void notebook.refetch()} />;
  return <NotebookPage notebook={notebook.data} />;
}
