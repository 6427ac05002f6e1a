import { READOUT_NAMES } from '@rolloff/solver';
import type { Readout } from '@rolloff/solver';
import { formatReadout } from '../lib/readout-labels';

/**
 * Readouts worth a line: a "peak" too small to show at the panel's hundredth of a dB is the
 * ripple of a flat passband, not a peak, so it and its frequency are left out.
 */
export function shownReadouts(readouts: readonly Readout[]): Readout[] {
  const flat = new Set(readouts.filter((r) => r.name === 'peak' && Math.abs(r.value) < 0.005).map((r) => r.trace));
  return readouts.filter((r) => !(flat.has(r.trace) && (r.name === 'peak' || r.name === 'peak-frequency')));
}

/** The readouts of a cell, grouped by trace. */
export function ReadoutsPanel({ readouts: all, stale = false }: { readouts: readonly Readout[]; stale?: boolean }) {
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
