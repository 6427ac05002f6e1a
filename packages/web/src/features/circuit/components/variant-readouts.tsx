import { READOUT_NAMES } from '@rolloff/solver';
import type { Readout, ReadoutId, VariantResult } from '@rolloff/solver';
import { formatReadout, shownReadouts } from '../lib/readout-labels';

/** One trace's readouts over the variants: a row per readout, a cell per variant (null where it has none). */
export interface VariantReadoutTable {
  trace: string;
  rows: { name: ReadoutId; cells: (Readout | null)[] }[];
}

/**
 * The readouts of a cell's variants as tables, one per trace, in the order the solver gives
 * them; a readout shown for any variant gets a row.
 */
export function variantReadoutTables(variants: readonly VariantResult[]): VariantReadoutTable[] {
  const shown = variants.map((v) => shownReadouts(v.readouts));
  const traces = [...new Set(shown.flatMap((list) => list.map((r) => r.trace)))];
  return traces.map((trace) => {
    const names = [...new Set(shown.flatMap((list) => list.filter((r) => r.trace === trace).map((r) => r.name)))];
    return { trace, rows: names.map((name) => ({ name, cells: shown.map((list) => list.find((r) => r.trace === trace && r.name === name) ?? null) })) };
  });
}

/** The readouts of a cell with variants: per trace, a table with one column per variant. */
export function VariantReadouts({ variants, stale = false }: { variants: readonly VariantResult[]; stale?: boolean }) {
  const tables = variantReadoutTables(variants);
  if (tables.length === 0) return null;
  return (
    <section aria-label="Readouts" data-testid="readouts" className={`rounded-lg border border-rule bg-panel p-3 ${stale ? 'opacity-60' : ''}`}>
      <h3 className="mb-2 text-xs font-semibold uppercase tracking-wide text-ink-faint">Readouts</h3>
      <div className="space-y-3 overflow-x-auto">
        {tables.map((table) => (
          <table key={table.trace} className="text-sm" data-trace={table.trace}>
            <caption className="text-left font-medium text-ink-soft">{table.trace}</caption>
            <thead>
              <tr>
                <th scope="col" className="pr-4 text-left font-normal text-ink-faint">
                  <span className="sr-only">readout</span>
                </th>
                {variants.map((v, i) => (
                  <th key={i} scope="col" className="whitespace-nowrap px-2 text-right font-medium text-ink-soft">
                    {v.label}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {table.rows.map((row) => (
                <tr key={row.name} data-readout={row.name}>
                  <th scope="row" className="whitespace-nowrap pr-4 text-left font-normal text-ink-soft first-letter:uppercase">
                    {READOUT_NAMES[row.name]}
                  </th>
                  {row.cells.map((r, i) => (
                    <td key={i} className="whitespace-nowrap px-2 text-right font-mono tabular-nums text-ink" data-value={r?.value}>
                      {r === null ? '–' : formatReadout(r)}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        ))}
      </div>
    </section>
  );
}
