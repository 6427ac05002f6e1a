import { READOUT_NAMES } from '@rolloff/solver';
import type { Readout, VariantResult } from '@rolloff/solver';
import { formatReadout, shownReadouts } from '../lib/readout-labels';
import { VariantReadouts } from './variant-readouts';

/** The readouts of a cell, grouped by trace; of a cell with variants, a table per trace with a column per variant. */
export function ReadoutsPanel({
  readouts: all,
  variants,
  stale = false,
}: {
  readouts: readonly Readout[];
  variants?: readonly VariantResult[];
  stale?: boolean;
}) {
  if (variants !== undefined && variants.length > 0) return <VariantReadouts variants={variants} stale={stale} />;
  const readouts = shownReadouts(all);
  if (readouts.length === 0) return null;
  const traces = [...new Set(readouts.map((r) => r.trace))];
  return (
    <section aria-label="Readouts" data-testid="readouts" className={`rounded-lg border border-rule bg-panel p-3 ${stale ? 'opacity-60' : ''}`}>
      <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-faint">Readouts</h3>
      <div className="grid gap-3 sm:grid-cols-2">
        {traces.map((trace) => (
          <dl key={trace} className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
            {traces.length > 1 ? <dt className="col-span-2 font-medium text-ink-soft">{trace}</dt> : null}
            {readouts
              .filter((r) => r.trace === trace)
              .map((r) => (
                <div key={r.name} className="contents" data-readout={r.name} data-trace={r.trace}>
                  <dt className="whitespace-nowrap text-ink-soft first-letter:uppercase">{READOUT_NAMES[r.name]}</dt>
                  <dd className="whitespace-nowrap font-mono tabular-nums text-ink" data-value={r.value}>
                    {formatReadout(r)}
                  </dd>
                </div>
              ))}
          </dl>
        ))}
      </div>
    </section>
  );
}
