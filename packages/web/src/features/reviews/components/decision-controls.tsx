/**
 * A reviewer's decision on a round: ask for changes (a summary says what) or sign off. Only
 * people asked in the round see the controls, and only while they can still decide: a
 * sign-off is final for its round, and a superseded round takes no more decisions.
 */
import type { Review } from '@rolloff/api/contract';
import { ReviewDecisionCreateSchema } from '@rolloff/api/contract';
import { useId, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { ErrorMessage } from '../../../components/ui/status-message';
import { useDecideReview } from '../api/decide-review';
import { myDecision } from './review-state';

export interface DecisionControlsProps {
  notebookId: string;
  review: Review;
  meId: number;
  onDecided?: (review: Review) => void;
}

/** The decision form of the signed-in reviewer, or a line saying where they stand. */
export function DecisionControls({ notebookId, review, meId, onDecided }: DecisionControlsProps) {
  const decide = useDecideReview(notebookId, review.id, onDecided);
  const [summary, setSummary] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  const summaryId = useId();
  const where = myDecision(review, meId);

  if (where.kind === 'not-asked') return null;
  if (where.kind === 'superseded') {
    return <p className="text-sm text-ink-soft">A later round replaced this one; decide there.</p>;
  }
  if (where.kind === 'signed-off') {
    return (
      <p role="status" className="rounded-md bg-pass-soft px-3 py-2 text-sm text-pass" data-testid="my-decision">
        You signed off this round.
      </p>
    );
  }

  const send = (state: 'needs_changes' | 'signed_off') => {
    const parsed = ReviewDecisionCreateSchema.safeParse({ state, summary });
    if (!parsed.success) {
      setProblem(parsed.error.issues[0]?.message ?? 'The decision is not valid.');
      return;
    }
    setProblem(null);
    decide.mutate(parsed.data, { onSuccess: () => setSummary('') });
  };

  return (
    <form className="space-y-2" data-testid="decision-controls" aria-label="Your decision" onSubmit={(event) => event.preventDefault()}>
      <p className="text-sm font-medium">Your decision on version {review.version.number}</p>
      {where.state === 'needs_changes' ? (
        <p className="text-sm text-ink-soft">You asked for changes in this round. Sign off once they are made, or wait for the next version.</p>
      ) : null}
      <label htmlFor={summaryId} className="block text-sm text-ink-soft">
        Summary <span className="text-ink-faint">(Markdown; needed to ask for changes)</span>
      </label>
      <textarea
        id={summaryId}
        value={summary}
        onChange={(event) => setSummary(event.target.value)}
        rows={4}
        className="w-full rounded-md border border-rule bg-panel px-2 py-1.5 text-sm"
      />
      {problem ? <p className="text-sm text-fail">{problem}</p> : null}
      {decide.error ? <ErrorMessage error={decide.error} /> : null}
      <div className="flex flex-wrap gap-2">
        {where.state === 'requested' ? (
          <Button variant="danger" disabled={decide.isPending} onClick={() => send('needs_changes')}>
            Ask for changes
          </Button>
        ) : null}
        <Button variant="primary" disabled={decide.isPending} onClick={() => send('signed_off')}>
          Sign off
        </Button>
      </div>
    </form>
  );
}
