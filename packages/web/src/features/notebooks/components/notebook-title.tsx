/** The notebook's title, edited in place by those who may edit (Enter saves, Escape cancels). */
import type { Notebook } from '@rolloff/api/contract';
import { TitleSchema } from '@rolloff/api/contract';
import { useState } from 'react';
import { useUpdateNotebook } from '../api/update-notebook';

export function NotebookTitle({ notebook }: { notebook: Notebook }) {
  const [draft, setDraft] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  const update = useUpdateNotebook(notebook.id);
  if (!notebook.permissions.edit) return <h1 className="text-2xl font-semibold tracking-tight">{notebook.title}</h1>;
  if (draft === null) {
    return (
      <h1 className="text-2xl font-semibold tracking-tight">
        <button type="button" onClick={() => setDraft(notebook.title)} className="rounded text-left hover:bg-sunken" title="Rename">
          {notebook.title}
        </button>
      </h1>
    );
  }
  const commit = () => {
    const parsed = TitleSchema.safeParse(draft);
    if (!parsed.success) {
      setProblem(parsed.error.issues[0]?.message ?? 'The title is not valid.');
      return;
    }
    if (parsed.data === notebook.title) {
      setDraft(null);
      return;
    }
    update.mutate({ title: parsed.data }, { onSuccess: () => setDraft(null), onError: (error) => setProblem(error.message) });
  };
  return (
    <div>
      <input
        autoFocus
        aria-label="Notebook title"
        value={draft}
        onChange={(event) => {
          setDraft(event.target.value);
          setProblem(null);
        }}
        onBlur={commit}
        onKeyDown={(event) => {
          if (event.key === 'Enter') commit();
          if (event.key === 'Escape') {
            setDraft(null);
            setProblem(null);
          }
        }}
        disabled={update.isPending}
        className="w-full rounded-md border border-rule bg-panel px-2 py-1 text-2xl font-semibold tracking-tight"
      />
      {problem ? <p className="mt-1 text-sm text-fail">{problem}</p> : null}
    </div>
  );
}
