import type { Diagnostic } from '@rolloff/solver';
import { useEffect, useState } from 'react';

/** Quiet time after the last change before the problems are read out. */
const SETTLE_MS = 1200;

/** "2 errors. Line 4: a capacitor's value is in F." — the count and the first message. */
export function announcementOf(diagnostics: readonly Diagnostic[]): string {
  const problems = diagnostics.filter((d) => d.severity === 'error' || d.severity === 'warning');
  if (problems.length === 0) return 'No problems.';
  const errors = problems.filter((d) => d.severity === 'error').length;
  const warnings = problems.length - errors;
  const counts = [errors ? `${errors} ${errors === 1 ? 'error' : 'errors'}` : '', warnings ? `${warnings} ${warnings === 1 ? 'warning' : 'warnings'}` : '']
    .filter(Boolean)
    .join(', ');
  const first = problems.find((d) => d.severity === 'error') ?? problems[0];
  return `${counts}. Line ${first.line}: ${first.message}`;
}

/**
 * Reads the cell's problems out to a screen reader while the cell is being edited, once the
 * typing has settled and only when they changed: the count and the first message.
 */
export function DiagnosticsAnnouncement({ diagnostics, editing }: { diagnostics: readonly Diagnostic[] | null; editing: boolean }) {
  const [spoken, setSpoken] = useState('');
  const next = diagnostics && editing ? announcementOf(diagnostics) : null;
  useEffect(() => {
    if (next === null) return;
    const timer = setTimeout(() => setSpoken(next), SETTLE_MS);
    return () => clearTimeout(timer);
  }, [next]);
  return (
    <span role="status" className="sr-only" data-testid="diagnostics-announcement">
      {editing ? spoken : ''}
    </span>
  );
}
