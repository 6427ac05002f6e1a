/**
 * The curves for reading rather than looking: every trace's value at a typed frequency (the
 * arrow keys step along the sweep), and a paged table of the traces at the sweep points. For
 * screen readers, keyboards, and anyone who wants the numbers.
 */
import { formatSi } from '@rolloff/solver';
import type { NumberArray, Result, TraceResult } from '@rolloff/solver';
import { useId, useMemo, useState } from 'react';
import { Button } from '../../../components/ui/button';
import { readFrequency } from '../../../lib/frequency';
import { formatValue } from '../lib/readout-labels';
import { valueAtFrequency } from '../plot/trace-at';

const ROWS_PER_PAGE = 50;

/** What a column of the table shows of a trace: gain in dB, or an impedance's magnitude in Ω. */
function levelOf(trace: TraceResult): { heading: string; values: NumberArray; unit: string } {
  return trace.kind === 'impedance'
    ? { heading: `${trace.label} · magnitude (${trace.unit})`, values: trace.magnitude, unit: trace.unit }
    : { heading: `${trace.label} · gain (dB)`, values: trace.magnitudeDb, unit: 'dB' };
}

/** The index of the sweep point nearest `hz` (on the log axis), or of the first point. */
function nearestPoint(frequencies: NumberArray, hz: number | null): number {
  if (hz === null || frequencies.length === 0) return 0;
  let best = 0;
  for (let i = 1; i < frequencies.length; i += 1) {
    if (Math.abs(Math.log(frequencies[i] / hz)) < Math.abs(Math.log(frequencies[best] / hz))) best = i;
  }
  return best;
}

/** Each trace's level and phase at `hz`, in words. */
/** What is read off: the whole result's curves, or one variant's. */
type Curves = Pick<Result, 'frequencies' | 'traces'>;

export function valuesInWords(result: Curves, hz: number): string {
  const { frequencies } = result;
  if (frequencies.length === 0) return 'The cell has no sweep.';
  if (hz < frequencies[0] || hz > frequencies[frequencies.length - 1]) {
    return `${formatSi(hz, 'Hz')} is outside the sweep (${formatSi(frequencies[0], 'Hz')} to ${formatSi(frequencies[frequencies.length - 1], 'Hz')}).`;
  }
  const onPoint = Array.from(frequencies).some((f) => Math.abs(f / hz - 1) < 1e-9);
  const parts = result.traces.map((trace) => {
    const level = levelOf(trace);
    const value = valueAtFrequency(frequencies, level.values, hz);
    const phase = valueAtFrequency(frequencies, trace.phaseDeg, hz);
    if (value === null || phase === null) return `${trace.label}: no value`;
    return `${trace.label}: ${formatValue(value, level.unit)}, ${formatValue(phase, 'deg')}`;
  });
  return `At ${formatSi(hz, 'Hz')}${onPoint ? '' : ' (between sweep points)'}: ${parts.join('; ')}.`;
}

/** The value of every trace at a frequency the designer types or steps to. */
function ValueAtFrequency({ result }: { result: Curves }) {
  const id = useId();
  const [text, setText] = useState('');
  const read = text.trim() ? readFrequency(text) : null;
  const step = (by: number) => {
    const { frequencies } = result;
    if (frequencies.length === 0) return;
    const from = read?.ok ? nearestPoint(frequencies, read.hz) : by > 0 ? -1 : frequencies.length;
    const next = Math.min(frequencies.length - 1, Math.max(0, from + by));
    setText(formatSi(frequencies[next], 'Hz', 6));
  };
  return (
    <div className="space-y-1">
      <label htmlFor={id} className="block text-sm font-medium">
        Value at a frequency <span className="font-normal text-ink-soft">(↑ and ↓ step along the sweep)</span>
      </label>
      <input
        id={id}
        value={text}
        onChange={(event) => setText(event.target.value)}
        onKeyDown={(event) => {
          if (event.key === 'ArrowUp' || event.key === 'ArrowDown') {
            event.preventDefault();
            step(event.key === 'ArrowUp' ? 1 : -1);
          }
        }}
        placeholder="e.g. 1.6k"
        autoComplete="off"
        aria-describedby={`${id}-value`}
        className="w-64 rounded-md border border-rule bg-panel px-2 py-1 font-mono text-sm"
      />
      <output id={`${id}-value`} aria-live="polite" className="block text-sm" data-testid="value-at-frequency">
        {read === null ? '' : read.ok ? valuesInWords(result, read.hz) : read.message}
      </output>
    </div>
  );
}

/** The traces at the sweep points, a page of rows at a time. */
function TracesTable({ result }: { result: Curves }) {
  const [page, setPage] = useState(0);
  const columns = useMemo(() => result.traces.map((trace) => ({ trace, level: levelOf(trace) })), [result.traces]);
  const count = result.frequencies.length;
  const pages = Math.max(1, Math.ceil(count / ROWS_PER_PAGE));
  const shown = Math.min(page, pages - 1);
  const first = shown * ROWS_PER_PAGE;
  const last = Math.min(count, first + ROWS_PER_PAGE);
  const rows = Array.from({ length: last - first }, (_, i) => first + i);
  return (
    <div className="space-y-2">
      <div className="overflow-x-auto">
        <table className="min-w-full text-left text-sm tabular-nums" data-testid="traces-table">
          <caption className="pb-1 text-left text-ink-soft">
            The traces at the sweep points, rows {first + 1}–{last} of {count}
          </caption>
          <thead className="bg-sunken text-xs text-ink-soft">
            <tr>
              <th scope="col" className="px-2 py-1 font-medium">
                Frequency
              </th>
              {columns.map(({ trace, level }) => [
                <th key={`${trace.label}-level`} scope="col" className="px-2 py-1 font-medium">
                  {level.heading}
                </th>,
                <th key={`${trace.label}-phase`} scope="col" className="px-2 py-1 font-medium">
                  {trace.label} · phase (°)
                </th>,
              ])}
            </tr>
          </thead>
          <tbody className="font-mono">
            {rows.map((i) => (
              <tr key={i} className="border-t border-rule">
                <th scope="row" className="px-2 py-0.5 font-normal">
                  {formatSi(result.frequencies[i], 'Hz')}
                </th>
                {columns.map(({ trace, level }) => [
                  <td key={`${trace.label}-level`} className="px-2 py-0.5">
                    {formatValue(level.values[i], level.unit)}
                  </td>,
                  <td key={`${trace.label}-phase`} className="px-2 py-0.5">
                    {formatValue(trace.phaseDeg[i], 'deg')}
                  </td>,
                ])}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {pages > 1 ? (
        <div className="flex gap-2">
          <Button size="sm" disabled={shown === 0} onClick={() => setPage(shown - 1)}>
            Previous rows
          </Button>
          <Button size="sm" disabled={shown === pages - 1} onClick={() => setPage(shown + 1)}>
            Next rows
          </Button>
        </div>
      ) : null}
    </div>
  );
}

/** A cell with a `vary` line: which variant's curves are read. */
function VariantChoice({ result, chosen, onChoose }: { result: Result; chosen: number; onChoose: (index: number) => void }) {
  const id = useId();
  return (
    <div className="flex flex-wrap items-center gap-2">
      <label htmlFor={id} className="text-ink-soft">
        Variant
      </label>
      <select
        id={id}
        value={chosen}
        onChange={(event) => onChoose(Number(event.target.value))}
        className="rounded-md border border-rule bg-panel px-2 py-1 text-sm"
      >
        {result.variants!.map((variant, index) => (
          <option key={variant.label} value={index}>
            {variant.label}
          </option>
        ))}
      </select>
    </div>
  );
}

/** "Read the curves": values at a frequency and the data table, folded away until opened. */
export function TraceData({ result }: { result: Result }) {
  const [choice, setChosen] = useState(0);
  // A new result may have fewer variants than the one the choice was made on.
  const chosen = Math.min(choice, (result.variants?.length ?? 1) - 1);
  const variant = result.variants?.[chosen];
  const curves: Curves = variant ?? result;
  if (curves.traces.length === 0 || curves.frequencies.length === 0) return null;
  return (
    <details className="rounded-lg border border-rule bg-panel text-sm" data-testid="trace-data">
      <summary className="cursor-pointer px-3 py-1.5 text-ink-soft">Read the curves: values at a frequency and a data table</summary>
      <div className="space-y-4 px-3 pb-3">
        {result.variants ? <VariantChoice result={result} chosen={chosen} onChoose={setChosen} /> : null}
        <ValueAtFrequency result={curves} />
        <TracesTable key={chosen} result={curves} />
      </div>
    </details>
  );
}
