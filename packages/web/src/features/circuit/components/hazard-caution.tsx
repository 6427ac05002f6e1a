import type { Diagnostic } from '@rolloff/solver';
import { sentence } from '../lib/cautions';

/** The caution shown beside a cell the solver finds at mains or another hazardous voltage, in the solver's words. */
export function HazardCaution({ cautions }: { cautions: readonly Diagnostic[] }) {
  if (cautions.length === 0) return null;
  return (
    <aside role="note" data-testid="hazard-caution" className="rounded-lg border border-warn bg-warn-soft p-3 text-sm text-ink">
      <p className="font-semibold text-warn">Caution: hazardous voltage</p>
      {cautions.map((c) => (
        <p key={`${c.line}:${c.column}`} className="mt-1" data-line={c.line}>
          {sentence(c.message)} {c.hint ? sentence(c.hint) : null}
        </p>
      ))}
    </aside>
  );
}

/** The reminder that results come from small-signal linear models. */
export function SmallSignalNote() {
  return (
    <p className="text-xs text-ink-faint">
      Results are small-signal linear models: no clipping, slew limits, saturation, heating or breakdown. Check the real circuit before trusting it with more.
    </p>
  );
}
