import { formatSi } from '@rolloff/solver';
import type { RequirementResult, TraceResult } from '@rolloff/solver';
import { parseRequirementRange } from '../plot/requirement-ranges';
import { traceNamed } from '../plot/result-figures';
import { formatValue, measureUnit } from '../lib/readout-labels';

function measuredText(requirement: RequirementResult, traces: readonly TraceResult[]): string {
  const range = parseRequirementRange(requirement.text);
  const trace = range ? traceNamed(traces, range.target) : undefined;
  const unit = requirement.unit ?? (range ? measureUnit(range.measure, trace?.unit) : '');
  const value = formatValue(requirement.measured, unit);
  if (requirement.status === 'not-available') return 'could not be checked in this sweep';
  return requirement.worstAt === null ? value : `worst ${value} at ${formatSi(requirement.worstAt, 'Hz')}`;
}

/** Each requirement of a cell as a pass or fail badge with what was measured. */
export function RequirementBadges({ requirements, traces, stale = false }: { requirements: readonly RequirementResult[]; traces: readonly TraceResult[]; stale?: boolean }) {
  if (requirements.length === 0) return null;
  const failed = requirements.filter((r) => !r.pass).length;
  const badge = (r: RequirementResult) =>
    r.status === 'not-available' ? ['n/a', 'bg-sunken text-ink-soft'] : r.pass ? ['pass', 'bg-pass-soft text-pass'] : ['fail', 'bg-fail-soft text-fail'];
  return (
    <section aria-label="Requirements" className={`rounded-lg border border-rule bg-panel p-3 ${stale ? 'opacity-60' : ''}`}>
      <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-faint">
        Requirements · {failed === 0 ? 'all pass' : `${failed} of ${requirements.length} fail`}
      </h3>
      <ul className="space-y-1.5">
        {requirements.map((r) => (
          <li key={r.line} data-testid="requirement" data-pass={r.pass} className="flex flex-wrap items-center gap-2 text-sm">
            <span className={`inline-flex min-w-14 justify-center rounded-full px-2 py-0.5 text-xs font-semibold ${badge(r)[1]}`}>{badge(r)[0]}</span>
            <code className="font-mono text-ink">{r.text.replace(/^require\s+/, '')}</code>
            <span className="text-ink-faint">
              line {r.line} · {measuredText(r, traces)}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
