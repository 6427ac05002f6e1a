import { cleanup, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it, vi } from 'vitest';
import { buildRevision } from '../../../test/cells';
import { ConflictDialog, sideBySide } from './conflict-dialog';

const theirsText = 'drive in\nR1 [in out] 10k\nC1 [out gnd] 10n\nshow out';
const mineText = 'drive in\nR1 [in out] 12k\nC1 [out gnd] 10n\nshow out';

describe('the conflict dialog', () => {
  afterEach(cleanup);

  it('shows both texts side by side with the lines that differ marked', () => {
    render(<ConflictDialog open mine={mineText} theirs={buildRevision(4, theirsText)} onKeepMine={() => {}} onTakeTheirs={() => {}} onDismiss={() => {}} />);
    const theirs = screen.getByTestId('conflict-theirs');
    const mine = screen.getByTestId('conflict-mine');
    expect(theirs.textContent).toContain('R1 [in out] 10k');
    expect(mine.textContent).toContain('R1 [in out] 12k');
    expect([...theirs.querySelectorAll('[data-changed]')].map((n) => n.textContent)).toEqual(['R1 [in out] 10k']);
    expect([...mine.querySelectorAll('[data-changed]')].map((n) => n.textContent)).toEqual(['R1 [in out] 12k']);
    expect(screen.getByText(/Tobias Okafor saved revision 4/)).toBeTruthy();
  });

  it('offers keeping mine as a new revision or taking theirs', async () => {
    const keep = vi.fn();
    const take = vi.fn();
    render(<ConflictDialog open mine={mineText} theirs={buildRevision(4, theirsText)} onKeepMine={keep} onTakeTheirs={take} onDismiss={() => {}} />);
    await userEvent.click(screen.getByRole('button', { name: 'Keep mine as a new revision' }));
    expect(keep).toHaveBeenCalledTimes(1);
    await userEvent.click(screen.getByRole('button', { name: 'Take theirs' }));
    expect(take).toHaveBeenCalledTimes(1);
  });

  it('pairs unchanged lines and keeps every line of both texts', () => {
    const sides = sideBySide('a\nb\nc', 'a\nx\nc\nd');
    expect(sides.theirs.lines.map((l) => l.text)).toEqual(['a', 'b', 'c']);
    expect(sides.mine.lines.map((l) => [l.text, l.changed])).toEqual([
      ['a', false],
      ['x', true],
      ['c', false],
      ['d', true],
    ]);
  });
});
