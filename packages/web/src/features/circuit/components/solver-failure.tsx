/**
 * What a cell shows when the solver could not run it. A run stopped for taking longer than
 * the browser's time budget offers to solve it anyway, without the budget.
 */
import type { AnalysisOutcome } from '../worker/analysis-scheduler';
import { Button } from '../../../components/ui/button';

export function SolverFailure({ outcome, onSolveAnyway }: { outcome: Extract<AnalysisOutcome, { ok: false }>; onSolveAnyway: () => void }) {
  return (
    <div role="alert" className="space-y-2 rounded-lg border border-fail bg-fail-soft p-3 text-sm text-fail">
      <p>The solver could not run this cell: {outcome.message}</p>
      {outcome.overBudget ? (
        <Button size="sm" onClick={onSolveAnyway}>
          Solve anyway
        </Button>
      ) : null}
    </div>
  );
}
