import type { Diagnostic } from '@rolloff/solver';

/** The cell's problems as a list under the editor, for reading without hovering. */
export function DiagnosticsList({ diagnostics }: { diagnostics: readonly Diagnostic[] }) {
  if (diagnostics.length === 0) return null;
  const errors = diagnostics.filter((d) => d.severity === 'error').length;
  const warnings = diagnostics.length - errors;
  const summary = [errors ? `${errors} error${errors > 1 ? 's' : ''}` : '', warnings ? `${warnings} warning${warnings > 1 ? 's' : ''}` : ''].filter(Boolean).join(', ');
  return (
    <details open={errors > 0} className="rounded-lg border border-rule bg-panel text-sm" data-testid="diagnostics">
      <summary className="cursor-pointer px-3 py-1.5 text-ink-soft">{summary}</summary>
      <ul className="space-y-1 px-3 pb-2">
        {diagnostics.map((d, i) => (
          <li key={`${d.line}:${d.column}:${i}`} data-severity={d.severity} data-line={d.line}>
            <span className={`font-mono text-xs ${d.severity === 'error' ? 'text-fail' : 'text-warn'}`}>
              {d.line}:{d.column}
            </span>{' '}
            <span className="text-ink">{d.message}</span>
            {d.hint ? <span className="text-ink-soft"> — {d.hint}</span> : null}
          </li>
        ))}
      </ul>
    </details>
  );
}
