/** The versions of a notebook: make a labelled one (editors), and the list to open. */
import { VersionCreateSchema } from '@rolloff/api/contract';
import { useId, useState } from 'react';
import { Link } from 'react-router-dom';
import { Button } from '../../../components/ui/button';
import { FieldError, fieldProblem } from '../../../components/ui/field-error';
import { EmptyState, ErrorMessage, Loading } from '../../../components/ui/status-message';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { appPaths } from '../../../lib/paths';
import { useCreateVersion } from '../api/create-version';
import { useVersionList } from '../api/list-versions';

export function VersionsPanel({ notebookId, canCreate }: { notebookId: string; canCreate: boolean }) {
  const versions = useVersionList(notebookId);
  const create = useCreateVersion(notebookId);
  const [label, setLabel] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const labelId = useId();
  return (
    <div className="space-y-6">
      {canCreate ? (
        <form
          className="space-y-2 rounded-xl border border-rule bg-panel p-4"
          onSubmit={(event) => {
            event.preventDefault();
            const parsed = VersionCreateSchema.safeParse({ label });
            if (!parsed.success) {
              setProblem(parsed.error.issues[0]?.message ?? 'The label is not valid.');
              return;
            }
            setProblem(null);
            create.mutate(parsed.data, { onSuccess: () => setLabel('') });
          }}
        >
          <label htmlFor={labelId} className="block text-sm font-medium">
            Make a version of every cell as it is now
          </label>
          <div className="flex flex-wrap gap-2">
            <input
              id={labelId}
              value={label}
              onChange={(event) => setLabel(event.target.value)}
              placeholder="Label, e.g. Ready for review"
              {...fieldProblem(`${labelId}-problem`, problem)}
              className="min-w-56 flex-1 rounded-md border border-rule bg-panel px-3 py-1.5 text-sm"
            />
            <Button type="submit" variant="primary" disabled={create.isPending}>
              Make version
            </Button>
          </div>
          {problem ? <FieldError id={`${labelId}-problem`}>{problem}</FieldError> : null}
          {create.error ? <ErrorMessage error={create.error} /> : null}
          {create.data ? (
            <p role="status" className="text-sm text-pass">
              Version {create.data.number} “{create.data.label}” made.
            </p>
          ) : null}
        </form>
      ) : null}
      {versions.isPending ? <Loading text="Loading the versions…" /> : null}
      {versions.isError ? <ErrorMessage error={versions.error} retry={() => void versions.refetch()} /> : null}
      {versions.data && versions.data.items.length === 0 ? (
        <EmptyState title="No versions yet">A version freezes every cell as it is, for a review or as a point to fork from.</EmptyState>
      ) : null}
      {versions.data && versions.data.items.length > 0 ? (
        <ul className="divide-y divide-rule rounded-xl border border-rule bg-panel" data-testid="versions">
          {versions.data.items.map((version) => (
            <li key={version.number} className="flex flex-wrap items-center gap-3 px-4 py-3">
              <Link to={appPaths.version(notebookId, version.number)} className="font-medium text-accent underline-offset-2 hover:underline">
                Version {version.number}: {version.label}
              </Link>
              <span className="text-sm text-ink-faint" title={exactTime(version.createdAt)}>
                {version.author ? `by ${version.author.name || version.author.login}, ` : ''}
                {timeAgo(version.createdAt)} · {version.cellCount} cells
              </span>
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
