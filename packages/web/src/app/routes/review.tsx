/**
 * The review view: one round of review of a notebook version. The version's cells read-only
 * (every circuit cell with its plot, loop margins, pins and readouts), a pin composer under
 * each plot for people who may review, and a side panel with the decision controls of an
 * assigned reviewer, the people asked, every pin's thread and the round's history.
 */
import { cellName as nameOfCell } from '@rolloff/api/contract';
import type { Notebook, Review, Version } from '@rolloff/api/contract';
import { formatSi } from '@rolloff/solver';
import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useMemo, useState } from 'react';
import type { ReactNode } from 'react';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { data, Link, useParams } from 'react-router-dom';
import { buttonClass } from '../../components/ui/button';
import { MarkdownView } from '../../components/ui/markdown-view';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { useMe } from '../../features/auth/api/get-me';
import { CircuitReader } from '../../features/circuit/components/circuit-reader';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { useVersion, versionQueryOptions } from '../../features/notebooks/api/get-version';
import { pinListQueryOptions, usePinList } from '../../features/pins/api/list-pins';
import { PinComposer } from '../../features/pins/components/pin-composer';
import type { PinDraft } from '../../features/pins/components/pin-composer';
import { pinLabels, pinMarks } from '../../features/pins/components/pin-labels';
import { PinList } from '../../features/pins/components/pin-list';
import { reviewQueryOptions, useReview } from '../../features/reviews/api/get-review';
import { useReviewList } from '../../features/reviews/api/list-reviews';
import { DecisionControls } from '../../features/reviews/components/decision-controls';
import { ReviewStateBadge } from '../../features/reviews/components/review-badge';
import { ReviewersList, ReviewHistory, roundLine } from '../../features/reviews/components/review-round';
import { exactTime, timeAgo } from '../../lib/format-time';
import { appPaths } from '../../lib/paths';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { notebookIdOf } from '../route-params';
import { slugOf } from '../../lib/slug';
import { useDocumentTitle } from '../../hooks/use-document-title';

function reviewIdOf(params: { reviewId?: string }): number {
  const id = Number(params.reviewId);
  if (!Number.isInteger(id) || id <= 0) throw data({ what: 'This review' }, { status: 404 });
  return id;
}

export async function loader({ request, params }: LoaderFunctionArgs) {
  await requireMe(request);
  const id = notebookIdOf(params);
  const reviewId = reviewIdOf(params);
  const [, review] = await Promise.all([
    orRouteError(queryClient.ensureQueryData(notebookQueryOptions(id))),
    orRouteError(queryClient.ensureQueryData(reviewQueryOptions(id, reviewId)), 'This review'),
  ]);
  await Promise.all([
    orRouteError(queryClient.ensureQueryData(versionQueryOptions(id, review.version.number)), 'This version'),
    orRouteError(queryClient.ensureQueryData(pinListQueryOptions(id))),
  ]);
  return null;
}

function PanelSection({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="space-y-2" aria-label={title}>
      <h2 className="text-xs font-semibold uppercase tracking-wide text-ink-faint">{title}</h2>
      {children}
    </section>
  );
}

/** Links to the other rounds of the notebook's review, and where this one stands. */
function Rounds({ notebookId, current }: { notebookId: string; current: Review }) {
  const rounds = useReviewList(notebookId);
  if (!rounds.data || rounds.data.items.length < 2) return null;
  return (
    <PanelSection title="Rounds">
      <ul className="space-y-1 text-sm" data-testid="rounds">
        {rounds.data.items.map((round) => (
          <li key={round.id}>
            {round.id === current.id ? (
              <span className="font-medium" aria-current="page">
                {roundLine(round)} (this one)
              </span>
            ) : (
              <Link to={appPaths.review(notebookId, round.id)} className="text-accent underline-offset-2 hover:underline">
                {roundLine(round)}
              </Link>
            )}
          </li>
        ))}
      </ul>
    </PanelSection>
  );
}

interface ReviewPageProps {
  notebook: Notebook;
  review: Review;
  version: Version;
  meId: number;
}

function ReviewPage({ notebook, review, version, meId }: ReviewPageProps) {
  const id = notebook.id;
  const client = useQueryClient();
  const pins = usePinList(id);
  const items = useMemo(() => pins.data?.items ?? [], [pins.data]);
  const labels = useMemo(() => pinLabels(items), [items]);
  const marksOf = useMemo(() => pinMarks(items, labels), [items, labels]);
  const [drafts, setDrafts] = useState<Record<number, PinDraft>>({});
  const [focusedPin, setFocusedPin] = useState<number | null>(null);
  const canPin = notebook.permissions.review && !notebook.deletedAt;
  const stem = slugOf(`${notebook.title}-v${version.number}-review`);
  const cellsById = useMemo(() => new Map(version.cells.map((cell) => [cell.cellId, cell])), [version.cells]);
  const cellName = useCallback(
    (cellId: number) => {
      const cell = cellsById.get(cellId);
      return cell ? nameOfCell(cell) : 'a cell not in this version';
    },
    [cellsById],
  );
  const onDecided = useCallback(() => void client.invalidateQueries({ queryKey: notebookQueryOptions(id).queryKey }), [client, id]);
  const requester = review.requestedBy ? review.requestedBy.name || review.requestedBy.login : 'someone no longer here';

  return (
    <section className="space-y-6">
      <header className="space-y-2 border-b border-rule pb-4">
        <p className="text-sm">
          <Link to={appPaths.notebook(id)} className="text-accent underline-offset-2 hover:underline">
            ← {notebook.title}
          </Link>
        </p>
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div className="space-y-1">
            <h1 className="text-2xl font-semibold tracking-tight">
              Review of version {version.number}: {version.label}
            </h1>
            <p className="flex flex-wrap items-center gap-2 text-sm text-ink-soft">
              <span>Round {review.round}</span>
              <ReviewStateBadge state={review.state} />
              <span aria-hidden>·</span>
              <span title={exactTime(review.createdAt)}>
                asked by {requester} {timeAgo(review.createdAt)}
              </span>
              <span aria-hidden>·</span>
              <span>read-only</span>
            </p>
          </div>
          <nav aria-label="Review links" className="flex flex-wrap gap-2">
            <Link to={appPaths.version(id, version.number)} className={buttonClass('secondary')}>
              Version page
            </Link>
            <Link to={appPaths.activity(id)} className={buttonClass('secondary')}>
              Activity
            </Link>
          </nav>
        </div>
        {review.superseded ? (
          <p role="status" className="rounded-md bg-warn-soft px-3 py-1.5 text-sm text-warn" data-testid="superseded">
            A later round replaced this one; it takes no more decisions.
          </p>
        ) : null}
        {review.message ? (
          <div className="rounded-lg border border-rule bg-panel px-4 py-3">
            <MarkdownView text={review.message} compact />
          </div>
        ) : null}
      </header>
      <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
        {/* The panel comes first, so on a phone the decision sits near the top; wide screens put it beside the cells. */}
        <aside
          aria-label="Review panel"
          className="space-y-6 self-start lg:col-start-2 lg:row-start-1 lg:sticky lg:top-4 lg:max-h-[calc(100vh-2rem)] lg:overflow-y-auto lg:pr-1"
        >
          <DecisionControls notebookId={id} review={review} meId={meId} onDecided={onDecided} />
          <PanelSection title="Reviewers">
            <ReviewersList review={review} />
          </PanelSection>
          <PanelSection title="Pins">
            {pins.isPending ? <Loading text="Loading the pins…" /> : null}
            {pins.isError ? <ErrorMessage error={pins.error} retry={() => void pins.refetch()} /> : null}
            {pins.data ? (
              <PinList
                notebookId={id}
                pins={items}
                labels={labels}
                cellName={cellName}
                shownRevision={(cellId) => cellsById.get(cellId)?.revision}
                canComment={canPin}
                focusedPinId={focusedPin}
                emptyText={canPin ? 'Click a trace on a plot, or type a frequency under it, to pin a comment there.' : 'Nobody has pinned a comment yet.'}
              />
            ) : null}
          </PanelSection>
          <PanelSection title={`History of round ${review.round}`}>
            <ReviewHistory review={review} />
          </PanelSection>
          <Rounds notebookId={id} current={review} />
        </aside>
        <div className="min-w-0 space-y-4 lg:col-start-1 lg:row-start-1" data-testid="review-cells">
          {version.cells.map((cell, index) => (
            <article key={cell.cellId} className="rounded-xl border border-rule bg-panel/60 p-3" aria-label={nameOfCell(cell)} data-cell-id={cell.cellId}>
              <h2 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-faint">
                {nameOfCell(cell)} · revision {cell.revision}
              </h2>
              {cell.kind === 'circuit' ? (
                <CircuitReader
                  cellKey={`${id}:review:v${version.number}:${cell.cellId}`}
                  text={cell.text}
                  label={`${nameOfCell(cell)} of version ${version.number}`}
                  filename={`${stem}-cell-${index + 1}`}
                  pins={marksOf(cell.cellId, cell.revision)}
                  onPick={(pick) => {
                    if (pick.kind === 'pin') setFocusedPin(pick.pinId);
                    else if (canPin)
                      setDrafts((old) => ({ ...old, [cell.cellId]: { trace: pick.trace, frequency: formatSi(pick.frequency, 'Hz'), picked: Date.now() } }));
                  }}
                  footer={
                    canPin
                      ? (traces) => (
                          <PinComposer
                            notebookId={id}
                            cellId={cell.cellId}
                            cellName={cellName(cell.cellId)}
                            revisionNumber={cell.revision}
                            traces={traces}
                            draft={drafts[cell.cellId] ?? { trace: traces[0] ?? '', frequency: '' }}
                            onDraftChange={(draft) => setDrafts((old) => ({ ...old, [cell.cellId]: draft }))}
                            onPinned={(pin) => setFocusedPin(pin.id)}
                          />
                        )
                      : undefined
                  }
                />
              ) : (
                <MarkdownView text={cell.text} />
              )}
            </article>
          ))}
        </div>
      </div>
    </section>
  );
}

/** The version a round reviews, once it is loaded. */
function ReviewedVersion({ notebook, review, meId }: Omit<ReviewPageProps, 'version'>) {
  const version = useVersion(notebook.id, review.version.number);
  if (version.isPending) return <Loading text="Opening the version…" />;
  if (version.isError) return <ErrorMessage error={version.error} retry={() => void version.refetch()} />;
  return <ReviewPage notebook={notebook} review={review} version={version.data} meId={meId} />;
}

export function Component() {
  const params = useParams();
  const id = notebookIdOf(params);
  const reviewId = reviewIdOf(params);
  const me = useMe();
  const notebook = useNotebook(id);
  const review = useReview(id, reviewId);
  useDocumentTitle('Review', notebook.data?.title);
  if (notebook.isPending || review.isPending || me.isPending) return <Loading text="Opening the review…" />;
  if (notebook.isError || review.isError) {
    const retry = () => void Promise.all([notebook.refetch(), review.refetch()]);
    return <ErrorMessage error={notebook.error ?? review.error} retry={retry} />;
  }
  return <ReviewedVersion notebook={notebook.data} review={review.data} meId={me.data?.id ?? 0} />;
}
