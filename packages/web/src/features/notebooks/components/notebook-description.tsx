/**
 * The notebook's description under its title: plain text, shown as written (line breaks
 * kept, never rendered as Markdown). Those who may rename may also edit it in place:
 * Ctrl-Enter or leaving the field saves, Escape cancels. A refused or failed save keeps the
 * text in the field with the reason beside it.
 */
import type { Notebook } from '@rolloff/api/contract';
import { DescriptionSchema, LIMITS } from '@rolloff/api/contract';
import { useState } from 'react';
import { useUpdateNotebook } from '../api/update-notebook';

export function NotebookDescription({ notebook }: { notebook: Notebook }) {
  const [draft, setDraft] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const update = useUpdateNotebook(notebook.id);
  const text = notebook.description;

  if (draft === null) {
    if (!notebook.permissions.edit) {
      return text ? (
        <p className="max-w-prose whitespace-pre-line text-ink-soft" data-testid="notebook-description">
          {text}
        </p>
      ) : null;
    }
    return (
      <button
        type="button"
        onClick={() => setDraft(text)}
        title="Edit the description"
        data-testid="notebook-description"
        className={`block max-w-prose rounded text-left whitespace-pre-line hover:bg-sunken ${text ? 'text-ink-soft' : 'text-sm text-ink-faint italic'}`}
      >
        {text || 'Add a description…'}
      </button>
    );
  }

  const cancel = () => {
    setDraft(null);
    setProblem(null);
  };
  const commit = () => {
    // Disabling the field while saving can blur it: one save at a time.
    if (update.isPending) return;
    const parsed = DescriptionSchema.safeParse(draft);
    if (!parsed.success) {
      setProblem(parsed.error.issues[0]?.message ?? 'The description is not valid.');
      return;
    }
    if (parsed.data === text) {
      cancel();
      return;
    }
    update.mutate({ description: parsed.data }, { onSuccess: cancel, onError: (error) => setProblem(error.message) });
  };
  return (
    <div className="max-w-prose">
      <textarea
        autoFocus
        aria-label="Notebook description"
        aria-describedby="notebook-description-help"
        value={draft}
        rows={3}
        onChange={(event) => {
          setDraft(event.target.value);
          setProblem(null);
        }}
        onBlur={commit}
        onKeyDown={(event) => {
          if (event.key === 'Enter' && (event.ctrlKey || event.metaKey)) {
            event.preventDefault();
            commit();
          }
          if (event.key === 'Escape') cancel();
        }}
        disabled={update.isPending}
        className="w-full rounded-md border border-rule bg-panel px-2 py-1 text-ink-soft"
      />
      <p id="notebook-description-help" className="flex justify-between gap-3 text-xs text-ink-faint">
        <span>Plain text. Ctrl-Enter saves, Escape cancels.</span>
        <span className={draft.length > LIMITS.descriptionLength ? 'text-fail' : ''}>
          {draft.length} / {LIMITS.descriptionLength}
        </span>
      </p>
      {problem ? <p className="mt-1 text-sm text-fail">{problem}</p> : null}
    </div>
  );
}
