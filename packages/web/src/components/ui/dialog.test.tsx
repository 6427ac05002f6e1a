import { cleanup, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { useState } from 'react';
import { afterEach, describe, expect, it } from 'vitest';
import { Dialog } from './dialog';

function Opener() {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button type="button" onClick={() => setOpen(true)}>
        Share
      </button>
      <Dialog open={open} title="Share" onClose={() => setOpen(false)}>
        <input aria-label="Login" />
      </Dialog>
    </>
  );
}

describe('a dialog', () => {
  afterEach(cleanup);

  it('gives the focus back to the control that opened it', async () => {
    render(<Opener />);
    const opener = screen.getByRole('button', { name: 'Share' });
    await userEvent.click(opener);
    await userEvent.click(screen.getByLabelText('Login'));
    expect(document.activeElement).toBe(screen.getByLabelText('Login'));
    await userEvent.click(screen.getByRole('button', { name: 'Close' }));
    expect(screen.queryByLabelText('Login')).toBeNull();
    expect(document.activeElement).toBe(opener);
  });
});
