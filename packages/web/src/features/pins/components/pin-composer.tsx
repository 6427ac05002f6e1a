/**
 * Pinning a comment to a cell's plot: the trace, the frequency (typed, or filled in by a
 * click on the plot) and the comment in Markdown. The page holds the trace and frequency,
 * so a click on the plot can set them; the comment stays here.
 */
import type { Pin } from '@rolloff/api/contract';
import { PinCreateSchema } from '@rolloff/api/contract';
import { useEffect, useId, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { FieldError, fieldProblem } from '../../../components/ui/field-error';
import { ErrorMessage } from '../../../components/ui/status-message';
import { useCreatePin } from '../api/create-pin';
import { readFrequency } from '../../../lib/frequency';

/** Where the next pin goes, as the form shows it. */
export interface PinDraft {
  trace: string;
  /** As typed, or as a click on the plot wrote it (`27.54 kHz`). */
  frequency: string;
  /** Bumped by a click on the plot, so the comment box takes the focus. */
  picked?: number;
}

export interface PinComposerProps {
  notebookId: string;
  cellId: number;
  /** Where the cell is in the notebook, e.g. "circuit cell 2". */
  cellName: string;
  /** The revision the pin goes on (a review's version of the cell). */
  revisionNumber: number;
  /** The traces the cell draws, by label. */
  traces: readonly string[];
  draft: PinDraft;
  onDraftChange: (draft: PinDraft) => void;
  onPinned?: (pin: Pin) => void;
}

/** The form that makes a pin on one cell. */
export function PinComposer({ notebookId, cellId, cellName, revisionNumber, traces, draft, onDraftChange, onPinned }: PinComposerProps) {
  const create = useCreatePin(notebookId);
  const [body, setBody] = useState('');
  const [problem, setProblem] = useState<{ field: 'trace' | 'frequency' | 'body'; message: string } | null>(null);
  const [made, setMade] = useState<string | null>(null);
  const ids = { trace: useId(), frequency: useId(), body: useId() };
  const comment = useRef<HTMLTextAreaElement>(null);
  const trace = traces.includes(draft.trace) ? draft.trace : (traces[0] ?? '');

  useEffect(() => {
    if (draft.picked) comment.current?.focus();
  }, [draft.picked]);

  if (traces.length === 0) return null;
  return (
    <form
      className="space-y-2 rounded-lg border border-dashed border-rule bg-panel p-3"
      data-testid="pin-composer"
      aria-label={`Pin a comment on ${cellName}`}
      onSubmit={(event) => {
        event.preventDefault();
        setMade(null);
        const frequency = readFrequency(draft.frequency);
        if (!frequency.ok) {
          setProblem({ field: 'frequency', message: frequency.message });
          return;
        }
        const parsed = PinCreateSchema.safeParse({ cellId, revisionNumber, trace, frequency: frequency.hz, body });
        if (!parsed.success) {
          const issue = parsed.error.issues[0];
          const field = issue?.path[0] === 'trace' || issue?.path[0] === 'frequency' ? issue.path[0] : 'body';
          setProblem({ field, message: issue?.message ?? 'The pin is not valid.' });
          return;
        }
        setProblem(null);
        create.mutate(parsed.data, {
          onSuccess: (pin) => {
            setBody('');
            setMade(`Pinned at ${draft.frequency.trim()}.`);
            onPinned?.(pin);
          },
        });
      }}
    >
      <p className="text-sm font-medium">Pin a comment at a frequency</p>
      <p className="text-xs text-ink-faint">Click a trace on the plot to pick its frequency, or type one (27k, 27 kHz, 1.5M).</p>
      <div className="flex flex-wrap gap-2">
        <label htmlFor={ids.trace} className="sr-only">
          Trace
        </label>
        <select
          id={ids.trace}
          value={trace}
          onChange={(event) => onDraftChange({ ...draft, trace: event.target.value })}
          {...fieldProblem(`${ids.trace}-problem`, problem?.field === 'trace')}
          className="max-w-56 rounded-md border border-rule bg-panel px-2 py-1 text-sm"
        >
          {traces.map((label) => (
            <option key={label} value={label}>
              {label}
            </option>
          ))}
        </select>
        <label htmlFor={ids.frequency} className="sr-only">
          Frequency
        </label>
        <input
          id={ids.frequency}
          value={draft.frequency}
          onChange={(event) => onDraftChange({ ...draft, trace, frequency: event.target.value })}
          placeholder="e.g. 27k"
          {...fieldProblem(`${ids.frequency}-problem`, problem?.field === 'frequency')}
          autoComplete="off"
          className="w-36 rounded-md border border-rule bg-panel px-2 py-1 font-mono text-sm"
        />
      </div>
      <label htmlFor={ids.body} className="sr-only">
        Comment
      </label>
      <textarea
        id={ids.body}
        ref={comment}
        value={body}
        onChange={(event) => setBody(event.target.value)}
        rows={3}
        placeholder="Comment (Markdown)"
        {...fieldProblem(`${ids.body}-problem`, problem?.field === 'body')}
        className="w-full rounded-md border border-rule bg-panel px-2 py-1.5 text-sm"
      />
      {problem ? <FieldError id={`${ids[problem.field]}-problem`}>{problem.message}</FieldError> : null}
      {create.error ? <ErrorMessage error={create.error} /> : null}
      {/* Always there, so a screen reader hears the confirmation when it appears. */}
      <p role="status" className="text-sm text-pass empty:hidden">
        {made}
      </p>
      <Button type="submit" variant="primary" size="sm" disabled={create.isPending}>
        {create.isPending ? 'Pinning…' : 'Pin comment'}
      </Button>
    </form>
  );
}
