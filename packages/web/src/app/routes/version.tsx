/** One version of a notebook, read-only: its cells as they were, and a fork from it. */
import { cellName } from '@rolloff/api/contract';
import type { LoaderFunctionArgs } from 'react-router-dom';
import { data, Link, useNavigate, useParams } from 'react-router-dom';
import { Button } from '../../components/ui/button';
import { ErrorMessage, Loading } from '../../components/ui/status-message';
import { MarkdownView } from '../../components/ui/markdown-view';
import { CircuitWorkbench } from '../../features/circuit/components/circuit-workbench';
import { useForkNotebook } from '../../features/notebooks/api/fork-notebook';
import { notebookQueryOptions, useNotebook } from '../../features/notebooks/api/get-notebook';
import { useVersion, versionQueryOptions } from '../../features/notebooks/api/get-version';
import { exactTime } from '../../lib/format-time';
import { appPaths } from '../../lib/paths';
import { orRouteError, requireMe } from '../loaders';
import { queryClient } from '../query-client';
import { notebookIdOf } from '../route-params';
import { slugOf } from '../../lib/slug';
import { useDocumentTitle } from '../../hooks/use-document-title';

function numberOf(params: { number?: string }): number {
  const n = Number(params.number);
  if (!Number.isInteger(n) || n <= 0) throw data({ what: 'This version' }, { status: 404 });
  return n;
}

export async function loader({ request, params }: LoaderFunctionArgs) {
  await requireMe(request);
  const id = notebookIdOf(params);
  const number = numberOf(params);
  await orRouteError(queryClient.ensureQueryData(notebookQueryOptions(id)));
  await orRouteError(queryClient.ensureQueryData(versionQueryOptions(id, number)), 'This version');
  return null;
}

export function Component() {
  const params = useParams();
  const id = notebookIdOf(params);
  const number = numberOf(params);
  const notebook = useNotebook(id);
  const version = useVersion(id, number);
  useDocumentTitle(version.data ? `Version ${version.data.number}` : null, notebook.data?.title);
  const fork = useForkNotebook(id);
  const navigate = useNavigate();
  if (notebook.isPending || version.isPending) return <Loading />;
  if (notebook.isError || version.isError) return <ErrorMessage error={notebook.error ?? version.error} />;
  const v = version.data;
  const stem = slugOf(`${notebook.data.title}-v${v.number}`);
  return (
    <section className="space-y-6">
      <header className="space-y-2 border-b border-rule pb-4">
        <p className="text-sm">
          <Link to={appPaths.versions(id)} className="text-accent underline-offset-2 hover:underline">
            ← Versions of {notebook.data.title}
          </Link>
        </p>
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div>
            <h1 className="text-2xl font-semibold tracking-tight">
              Version {v.number}: {v.label}
            </h1>
            <p className="text-sm text-ink-soft">
              {v.author ? `Made by ${v.author.name || v.author.login}, ` : ''}
              {exactTime(v.createdAt)} · read-only
            </p>
          </div>
          {notebook.data.permissions.fork ? (
            <Button disabled={fork.isPending} onClick={() => fork.mutate({ version: v.number }, { onSuccess: (copy) => navigate(appPaths.notebook(copy.id)) })}>
              Fork from this version
            </Button>
          ) : null}
        </div>
        {fork.error ? <ErrorMessage error={fork.error} /> : null}
      </header>
      <div className="space-y-4" data-testid="version-cells">
        {v.cells.map((cell, index) => (
          <article key={cell.cellId} className="rounded-xl border border-rule bg-panel/60 p-3" aria-label={cellName(cell)}>
            <h2 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-faint">
              {cellName(cell)} · revision {cell.revision}
            </h2>
            {cell.kind === 'circuit' ? (
              <CircuitWorkbench
                cellKey={`${id}:v${v.number}:${cell.cellId}`}
                text={cell.text}
                readOnly
                label={`${cellName(cell)} of version ${v.number}`}
                filename={`${stem}-cell-${index + 1}`}
                helpHref={appPaths.help()}
              />
            ) : (
              <MarkdownView text={cell.text} />
            )}
          </article>
        ))}
      </div>
    </section>
  );
}
