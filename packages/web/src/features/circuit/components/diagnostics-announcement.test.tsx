import type { Diagnostic } from '@rolloff/solver';
import { act, cleanup, render, screen } from '@testing-library/react';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { DiagnosticsAnnouncement, announcementOf } from './diagnostics-announcement';

const problem = (severity: Diagnostic['severity'], line: number, message: string): Diagnostic => ({
  severity,
  line,
  column: 1,
  endColumn: 2,
  message,
  code: 'test',
});

describe('reading a cell’s problems out', () => {
  beforeEach(() => vi.useFakeTimers());
  afterEach(() => {
    vi.useRealTimers();
    cleanup();
  });

  it('says the count and the first error', () => {
    expect(announcementOf([problem('warning', 2, 'node x touches one part'), problem('error', 5, 'a capacitor’s value is in F')])).toBe(
      '1 error, 1 warning. Line 5: a capacitor’s value is in F',
    );
    expect(announcementOf([])).toBe('No problems.');
  });

  it('waits for the typing to settle and speaks only while the cell is edited', () => {
    const first = [problem('error', 3, 'unknown part kind')];
    const { rerender } = render(<DiagnosticsAnnouncement diagnostics={first} editing />);
    const region = screen.getByTestId('diagnostics-announcement');
    expect(region.getAttribute('role')).toBe('status');
    expect(region.textContent).toBe('');
    act(() => vi.advanceTimersByTime(1200));
    expect(region.textContent).toBe('1 error. Line 3: unknown part kind');
    rerender(<DiagnosticsAnnouncement diagnostics={first} editing={false} />);
    expect(region.textContent).toBe('');
  });
});
