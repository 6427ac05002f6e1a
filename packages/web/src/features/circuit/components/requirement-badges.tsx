import { STATUS_WORDS, formatSi } from '@rolloff/solver';
import type { RequirementResult, RequirementStatus, VariantResult } from '@rolloff/solver';
import { formatValue } from '../lib/readout-labels';

const BADGE_STYLE: Record<RequirementStatus, string> = {
  pass: 'bg-pass-soft text-pass',
  fail: 'bg-fail-soft text-fail',
  'not-applicable': 'bg-sunken text-ink-soft',
};

/** What was measured; with variants, in which variant (the one that fails by most, or comes closest). */
function measuredText(requirement: RequirementResult, variants: readonly VariantResult[]): string {
  const shown = requirement.variants === undefined ? undefined : variants[requirement.variants.worst];
  const within = shown === undefined ? '' : ` with ${shown.label}`;
  if (requirement.status === 'not-applicable') return `not checked${within}: ${requirement.reason ?? 'the solver gave no reason'}`;
  const value = formatValue(requirement.measured, requirement.unit);
  return `${requirement.worstAt === null ? value : `worst ${value} at ${formatSi(requirement.worstAt, 'Hz')}`}${within}`;
}

/** Each variant's own status of the requirement at `index`: a small badge per variant, named by its value. */
function VariantStatuses({ index, variants }: { index: number; variants: readonly VariantResult[] }) {
  return (
    <ul aria-label="by variant" className="flex basis-full flex-wrap gap-1.5 pl-16">
      {variants.map((v, i) => {
        const own = v.requirements[index];
        if (own === undefined) return null;
        return (
          <li key={i} data-testid="variant-status" data-status={own.status} className="inline-flex items-center gap-1 text-xs text-ink-soft">
            <span className={`rounded-full px-1.5 font-semibold ${BADGE_STYLE[own.status]}`}>{STATUS_WORDS[own.status]}</span>
            {v.label}
          </li>
        );
      })}
    </ul>
  );
}

/** "all pass", "1 of 3 fail", "1 of 3 fail, 1 n/a". */
function summary(requirements: readonly RequirementResult[]): string {
  const failed = requirements.filter((r) => r.status === 'fail').length;
  const unchecked = requirements.filter((r) => r.status === 'not-applicable').length;
  if (failed === 0 && unchecked === 0) return `all ${STATUS_WORDS.pass}`;
  const parts = failed > 0 ? [`${failed} of ${requirements.length} ${STATUS_WORDS.fail}`] : [];
  if (unchecked > 0) parts.push(`${unchecked} ${STATUS_WORDS['not-applicable']}`);
  return parts.join(', ');
}

/**
 * Each requirement of a cell as a pass, fail or n/a badge with what was measured; with
 * variants, the badge is over every variant, and each variant's own status follows.
 */
export function RequirementBadges({
  requirements,
  variants = [],
  stale = false,
}: {
  requirements: readonly RequirementResult[];
  variants?: readonly VariantResult[];
  stale?: boolean;
}) {
  if (requirements.length === 0) return null;
  return (
    <section aria-label="Requirements" className={`rounded-lg border border-rule bg-panel p-3 ${stale ? 'opacity-60' : ''}`}>
      <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-faint">Requirements · {summary(requirements)}</h3>
      <ul className="space-y-1.5">
        {requirements.map((r, index) => (
          <li
            key={r.line}
            data-testid="requirement"
            data-status={r.status}
            data-pass={r.status === 'pass'}
            className="flex flex-wrap items-center gap-2 text-sm"
          >
            <span className={`inline-flex min-w-14 justify-center rounded-full px-2 py-0.5 text-xs font-semibold ${BADGE_STYLE[r.status]}`}>
              {STATUS_WORDS[r.status]}
            </span>
            <code className="font-mono text-ink">{r.text.replace(/^require\s+/, '')}</code>
            <span className="text-ink-faint">
              line {r.line} · {measuredText(r, variants)}
            </span>
            {r.variants !== undefined && variants.length > 0 ? <VariantStatuses index={index} variants={variants} /> : null}
          </li>
        ))}
      </ul>
    </section>
  );
}
