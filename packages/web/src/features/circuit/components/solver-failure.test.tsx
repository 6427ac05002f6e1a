import { cleanup, fireEvent, render, screen } from '@testing-library/react';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { SolverFailure } from './solver-failure';

describe('the solver failure note', () => {
  afterEach(cleanup);

  it('offers to solve anyway only after a run was stopped for its time', () => {
    const solveAnyway = vi.fn();
    render(<SolverFailure outcome={{ ok: false, text: 'x', message: 'solving it took longer than 5 s', overBudget: true }} onSolveAnyway={solveAnyway} />);
    expect(screen.getByRole('alert').textContent).toContain('The solver could not run this cell: solving it took longer than 5 s');
    fireEvent.click(screen.getByRole('button', { name: 'Solve anyway' }));
    expect(solveAnyway).toHaveBeenCalledTimes(1);
    cleanup();
    render(<SolverFailure outcome={{ ok: false, text: 'x', message: 'out of memory' }} onSolveAnyway={solveAnyway} />);
    expect(screen.queryByRole('button')).toBeNull();
  });
});
