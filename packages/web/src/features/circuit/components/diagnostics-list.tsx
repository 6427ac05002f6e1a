import type { Diagnostic, Severity } from '@rolloff/solver';

const WORDS: Record<Severity, [string, string]> = { error: ['error', 'errors'], warning: ['warning', 'warnings'], info: ['note', 'notes'] };
const COLOURS: Record<Severity, string> = { error: 'text-fail', warning: 'text-warn', info: 'text-ink-soft' };

/** "1 error, 2 warnings, 1 note". */
function summary(diagnostics: readonly Diagnostic[]): string {
  return (Object.keys(WORDS) as Severity[])
    .map((severity) => {
      const count = diagnostics.filter((d) => d.severity === severity).length;
      return count === 0 ? '' : `${count} ${WORDS[severity][count === 1 ? 0 : 1]}`;
    })
    .filter(Boolean)
    .join(', ');
}

/** The cell's problems (and notes) as a list under the editor, for reading without hovering. */
export function DiagnosticsList({ diagnostics }: { diagnostics: readonly Diagnostic[] }) {
  if (diagnostics.length === 0) return null;
  const errors = diagnostics.some((d) => d.severity === 'error');
  return (
    <details open={errors} className="rounded-lg border border-rule bg-panel text-sm" data-testid="diagnostics">
      <summary className="cursor-pointer px-3 py-1.5 text-ink-soft">{summary(diagnostics)}</summary>
      <ul className="space-y-1 px-3 pb-2">
        {diagnostics.map((d, i) => (
          <li key={`${d.line}:${d.column}:${i}`} data-severity={d.severity} data-line={d.line}>
            <span className={`font-mono text-xs ${COLOURS[d.severity]}`}>
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
