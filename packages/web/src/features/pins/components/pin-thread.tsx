/**
 * One pin and its thread: where it sits (trace, frequency, cell, revision), every comment
 * rendered as safe Markdown, and for people who may comment a reply box and resolve or
 * reopen. A pin made on an earlier revision says "on revision N".
 */
import type { Pin } from '@rolloff/api/contract';
import { PinCommentCreateSchema } from '@rolloff/api/contract';
import { formatSi } from '@rolloff/solver';
import { useEffect, useId, useRef, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { MarkdownView } from '../../../components/ui/markdown-view';
import { FieldError, fieldProblem } from '../../../components/ui/field-error';
import { ErrorMessage } from '../../../components/ui/status-message';
import { exactTime, timeAgo } from '../../../lib/format-time';
import { useReopenPin } from '../api/reopen-pin';
import { useReplyToPin } from '../api/reply-to-pin';
import { useResolvePin } from '../api/resolve-pin';

export interface PinThreadProps {
  notebookId: string;
  pin: Pin;
  label: string;
  /** Where the cell is in the notebook, e.g. "circuit cell 2". */
  cellName: string;
  /** The revision of the cell on screen, when it is not simply the current one. */
  shownRevision?: number;
  canComment: boolean;
  /** Scrolled to and focused, after a click on its marker or a link to it. */
  focused?: boolean;
}

const nameOf = (user: { name: string; login: string } | null) => (user ? user.name || user.login : 'someone no longer here');

function ReplyForm({ notebookId, pinId, onDone }: { notebookId: string; pinId: number; onDone: () => void }) {
  const reply = useReplyToPin(notebookId);
  const [body, setBody] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const id = useId();
  const box = useRef<HTMLTextAreaElement>(null);
  useEffect(() => box.current?.focus(), []);
  return (
    <form
      className="space-y-2"
      onSubmit={(event) => {
        event.preventDefault();
        const parsed = PinCommentCreateSchema.safeParse({ body });
        if (!parsed.success) {
          setProblem(parsed.error.issues[0]?.message ?? 'The reply is not valid.');
          return;
        }
        setProblem(null);
        reply.mutate({ pinId, body: parsed.data }, { onSuccess: onDone });
      }}
    >
      <label htmlFor={id} className="sr-only">
        Your reply
      </label>
      <textarea
        id={id}
        ref={box}
        value={body}
        onChange={(event) => setBody(event.target.value)}
        rows={3}
        placeholder="Reply (Markdown)"
        {...fieldProblem(`${id}-problem`, problem)}
        className="w-full rounded-md border border-rule bg-panel px-2 py-1.5 text-sm"
      />
      {problem ? <FieldError id={`${id}-problem`}>{problem}</FieldError> : null}
      {reply.error ? <ErrorMessage error={reply.error} /> : null}
      <div className="flex gap-2">
        <Button type="submit" size="sm" variant="primary" disabled={reply.isPending}>
          {reply.isPending ? 'Sending…' : 'Send reply'}
        </Button>
        <Button size="sm" variant="quiet" onClick={onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}

/** A pin's thread. */
export function PinThread({ notebookId, pin, label, cellName, shownRevision, canComment, focused = false }: PinThreadProps) {
  const [replying, setReplying] = useState(false);
  const resolve = useResolvePin(notebookId);
  const reopen = useReopenPin(notebookId);
  const element = useRef<HTMLLIElement>(null);
  useEffect(() => {
    if (!focused || !element.current) return;
    element.current.scrollIntoView?.({ block: 'nearest' });
    element.current.focus();
  }, [focused]);
  const movedOn = pin.revisionNumber < pin.currentRevisionNumber || (shownRevision !== undefined && shownRevision !== pin.revisionNumber);
  const toggle = pin.resolved ? reopen : resolve;

  return (
    <li
      ref={element}
      id={`pin-${pin.id}`}
      tabIndex={-1}
      data-testid="pin"
      data-pin-id={pin.id}
      data-resolved={pin.resolved}
      aria-label={`Pin ${label} at ${formatSi(pin.frequency, 'Hz')}`}
      className={`space-y-2 rounded-lg border p-3 ${focused ? 'border-sand' : 'border-rule'} ${pin.resolved ? 'bg-sunken/60' : 'bg-panel'}`}
    >
      <header className="flex flex-wrap items-center gap-x-2 gap-y-1 text-sm">
        <span className="rounded border border-sand bg-sand/25 px-1.5 py-0.5 text-xs font-semibold text-ink">{label}</span>
        <span className="font-mono font-medium tabular-nums">{formatSi(pin.frequency, 'Hz')}</span>
        <span className="text-ink-soft">
          on {pin.trace} · {cellName}
        </span>
        {movedOn ? (
          <span
            className="rounded-full bg-warn-soft px-2 py-0.5 text-xs font-medium text-warn"
            data-testid="pin-revision"
            title={`The cell is at revision ${pin.currentRevisionNumber} now.`}
          >
            on revision {pin.revisionNumber}
          </span>
        ) : null}
        {pin.resolved ? (
          <span className="rounded-full bg-pass-soft px-2 py-0.5 text-xs font-medium text-pass" data-testid="pin-resolved">
            resolved{pin.resolvedBy ? ` by ${nameOf(pin.resolvedBy)}` : ''}
          </span>
        ) : null}
      </header>
      <ol className="space-y-2">
        {pin.comments.map((comment) => (
          <li key={comment.id} data-testid="pin-comment" className="border-l-2 border-rule pl-2">
            <p className="text-xs text-ink-faint">
              <span className="font-medium text-ink-soft">{nameOf(comment.author)}</span> ·{' '}
              <time dateTime={comment.createdAt} title={exactTime(comment.createdAt)}>
                {timeAgo(comment.createdAt)}
              </time>
            </p>
            <MarkdownView text={comment.body} compact />
          </li>
        ))}
      </ol>
      {canComment ? (
        replying ? (
          <ReplyForm notebookId={notebookId} pinId={pin.id} onDone={() => setReplying(false)} />
        ) : (
          <div className="flex flex-wrap gap-2">
            <Button size="sm" onClick={() => setReplying(true)}>
              Reply
            </Button>
            <Button size="sm" variant="quiet" disabled={toggle.isPending} onClick={() => toggle.mutate(pin.id)}>
              {pin.resolved ? 'Reopen' : 'Resolve'}
            </Button>
          </div>
        )
      ) : null}
      {toggle.error ? <ErrorMessage error={toggle.error} /> : null}
    </li>
  );
}
