/**
 * Asking for a review: pick one or more of the notebook's members who may review (reviewer
 * role or higher), add a note, and send. The server reviews the latest version, or makes a
 * new one ("For review") when the notebook changed since.
 */
import type { NotebookRole, Review, UserRef } from '@rolloff/api/contract';
import { ReviewCreateSchema } from '@rolloff/api/contract';
import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Dialog } from '../../../components/ui/dialog';
import { RoleBadge } from '../../../components/ui/role-badge';
import { ErrorMessage, Loading } from '../../../components/ui/status-message';
import { useRequestReview } from '../api/request-review';

/** A member who could be asked. */
export interface ReviewCandidate {
  user: UserRef;
  role: NotebookRole;
}

export interface RequestReviewDialogProps {
  notebookId: string;
  open: boolean;
  onClose: () => void;
  /** Members with the reviewer role or higher, not counting the person asking; null while loading. */
  candidates: readonly ReviewCandidate[] | null;
  /** Why the candidates could not be loaded, if they could not. */
  candidatesError?: unknown;
  onRequested: (review: Review) => void;
  /** Opens sharing with the reviewer role chosen, for an owner with nobody to ask yet. */
  onShareFirst?: () => void;
}

/** The dialog behind "Ask for review". */
export function RequestReviewDialog({ notebookId, open, onClose, candidates, candidatesError, onRequested, onShareFirst }: RequestReviewDialogProps) {
  const [chosen, setChosen] = useState<ReadonlySet<number>>(new Set());
  const [message, setMessage] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const request = useRequestReview(notebookId, onRequested);
  const messageId = useId();
  const toggle = (id: number) =>
    setChosen((old) => {
      const next = new Set(old);
      if (next.has(id)) next.delete(id);
      else next.add(id);
      return next;
    });

  return (
    <Dialog open={open} title="Ask for a review" onClose={onClose}>
      <form
        className="space-y-4"
        onSubmit={(event) => {
          event.preventDefault();
          const parsed = ReviewCreateSchema.safeParse({ reviewerIds: [...chosen], message });
          if (!parsed.success) {
            setProblem(parsed.error.issues[0]?.message ?? 'The request is not valid.');
            return;
          }
          setProblem(null);
          request.mutate(parsed.data, {
            onSuccess: () => {
              setChosen(new Set());
              setMessage('');
            },
          });
        }}
      >
        <p className="text-sm text-ink-soft">
          The reviewers read the latest version. If the notebook changed since, a new version “For review” is made first. Each of them gets an e-mail with a
          link.
        </p>
        <fieldset className="space-y-2">
          <legend className="text-sm font-medium">Reviewers</legend>
          {candidatesError ? <ErrorMessage error={candidatesError} /> : null}
          {!candidates && !candidatesError ? <Loading text="Loading the members…" /> : null}
          {candidates && candidates.length === 0 ? (
            <div className="space-y-2 text-sm text-ink-soft">
              <p>Nobody else here may review yet. Share the notebook with someone as reviewer first.</p>
              {onShareFirst ? (
                <Button size="sm" onClick={onShareFirst}>
                  Share it with a reviewer…
                </Button>
              ) : (
                <p>Only the notebook’s owner can share it: ask them to add a reviewer.</p>
              )}
            </div>
          ) : null}
          {candidates && candidates.length > 0 ? (
            <ul className="space-y-1" data-testid="review-candidates">
              {candidates.map(({ user, role }) => (
                <li key={user.id}>
                  <label className="flex items-center gap-2 text-sm">
                    <input type="checkbox" checked={chosen.has(user.id)} onChange={() => toggle(user.id)} />
                    <span className="font-medium">{user.name || user.login}</span>
                    <span className="text-ink-faint">{user.login}</span>
                    <RoleBadge role={role} />
                  </label>
                </li>
              ))}
            </ul>
          ) : null}
        </fieldset>
        <div className="space-y-1">
          <label htmlFor={messageId} className="block text-sm font-medium">
            What should they look at? <span className="font-normal text-ink-faint">(optional, Markdown)</span>
          </label>
          <textarea
            id={messageId}
            value={message}
            onChange={(event) => setMessage(event.target.value)}
            rows={3}
            className="w-full rounded-md border border-rule bg-panel px-2 py-1.5 text-sm"
          />
        </div>
        {problem ? <p className="text-sm text-fail">{problem}</p> : null}
        {request.error ? <ErrorMessage error={request.error} /> : null}
        <div className="flex justify-end gap-2">
          <Button onClick={onClose}>Cancel</Button>
          <Button type="submit" variant="primary" disabled={request.isPending || chosen.size === 0}>
            {request.isPending ? 'Asking…' : 'Ask for review'}
          </Button>
        </div>
      </form>
    </Dialog>
  );
}
