/** `require` lines: the trace each names, and its limits in the units of its measure. */
import type { Measure, RequirementSpec, TraceSpec } from '../circuit.js';
import type { RequireStatement, ShowStatement, Value } from '../ast.js';
import { suggestionHint } from '../suggest.js';
import { formatSi } from '../units.js';
import { MEASURES, MEASURE_TRACE, MEASURE_WHERE } from '../vocabulary.js';
import type { MeasureWhere, Unit } from '../vocabulary.js';
import type { Elaboration } from './context.js';
import { bound, evaluate, read, sourceText } from './values.js';
import type { Slot } from './values.js';
import { labelOf } from './show.js';

/** A requirement as the analysis checks it, or null (with the reason reported). */
export function requireStatement(cx: Elaboration, st: RequireStatement, shows: ShowStatement[], traces: (TraceSpec | null)[]): RequirementSpec | null {
  const index = findTrace(cx, st, shows, traces);
  if (index === null) return null;
  const trace = traces[index] as TraceSpec;
  const measure = st.measure.name as Measure;
  const where = MEASURE_WHERE[measure];
  const needs = MEASURE_TRACE[measure];
  if (needs !== undefined && trace.kind !== needs) {
    const { article, how } = TRACE_NEEDED[needs];
    cx.error(st.measure.range, 'wrong-measure', `${measure} is measured on ${article}, and ${trace.label} is not one`, `${how} and require it of that trace`);
    return null;
  }
  if (needs !== 'step' && trace.kind === 'step') {
    cx.error(
      st.measure.range,
      'wrong-measure',
      `${measure} is a frequency-domain measure; ${trace.label} is a step response`,
      'a step response takes final, t63, rise-time, settling, overshoot and value … at T',
    );
    return null;
  }
  if (where !== 'point' && trace.kind === 'noise') {
    cx.error(st.measure.range, 'wrong-measure', `${measure} is not measured on a noise trace`, 'a noise trace takes gain and magnitude');
    return null;
  }
  if (!placeFits(cx, st, measure, where)) return null;
  const slot = measureSlot(measure, trace);
  const line = st.range.line;
  const value = read(cx, cx.top, st.value, line, slot);
  if (value === null) return null;
  const spec: RequirementSpec = { range: st.range, text: st.text, trace: index, measure, op: st.op.op, value };
  if (st.tolerance !== null && st.op.op === '=') {
    const q = evaluate(cx, cx.top, st.tolerance, line);
    if (q === null) return null;
    let tolerance: RequirementSpec['tolerance'];
    if (q.unit === '%' && measure !== 'overshoot') tolerance = { amount: q.value / 100, relative: true };
    else {
      const amount = read(cx, cx.top, st.tolerance, line, { ...slot, says: `the tolerance of ${measure} is in % or ${slot.unit || 'a plain number'}` });
      if (amount === null) return null;
      tolerance = { amount, relative: false };
    }
    if (!bound(cx, st.tolerance, tolerance.amount > 0, 'a tolerance is more than 0', 'write it like ± 2% or ± 0.5 dB')) return null;
    spec.tolerance = tolerance;
  }
  const hz: Slot = { says: 'a requirement’s frequencies are in Hz', units: ['Hz'], example: '1k' };
  if (st.over !== null) {
    const over: { from?: number; to?: number } = {};
    if (st.over.from !== null) {
      const f = read(cx, cx.top, st.over.from, line, hz);
      if (f === null) return null;
      if (!bound(cx, st.over.from, f >= 0, 'a frequency cannot be negative')) return null;
      over.from = f;
    }
    if (st.over.to !== null) {
      const f = read(cx, cx.top, st.over.to, line, hz);
      if (f === null) return null;
      if (!bound(cx, st.over.to, f > 0, 'the end of the range is above 0 Hz')) return null;
      over.to = f;
    }
    if (over.from !== undefined && over.to !== undefined && over.to <= over.from) {
      const fix =
        over.to < over.from && st.over.from !== null && st.over.to !== null
          ? {
              title: 'Swap the ends',
              replacement: `${sourceText(st.over.to)} .. ${sourceText(st.over.from)}`,
              range: { line, column: st.over.from.range.column, endColumn: st.over.to.range.endColumn },
            }
          : undefined;
      cx.error(
        st.over.range,
        'range-reversed',
        over.to === over.from
          ? 'this range is empty: both ends are the same'
          : `this range runs backwards, from ${formatSi(over.from, 'Hz')} down to ${formatSi(over.to, 'Hz')}`,
        over.to === over.from ? `for one frequency write at ${formatSi(over.from, 'Hz')}` : 'write the lower frequency first',
        fix,
      );
      return null;
    }
    spec.over = over;
  }
  if (st.at !== null) {
    // A step response is read at a time, everything else at a frequency.
    const step = trace.kind === 'step';
    const at = read(cx, cx.top, st.at, line, step ? { says: 'a step response is read at a time, in s', units: ['s'], example: '5m' } : hz);
    if (at === null) return null;
    if (!bound(cx, st.at, at >= 0, step ? 'a time cannot be negative: the step is at 0 s' : 'a frequency cannot be negative')) return null;
    spec.at = at;
  }
  if (trace.kind === 'noise') {
    cx.warn(st.range, 'not-available', 'requirements on noise are not available yet: this one is checked but not evaluated');
  }
  return spec;
}

/** The trace a requirement names: by label, then by the show line's words. */
function findTrace(cx: Elaboration, st: RequireStatement, shows: ShowStatement[], traces: (TraceSpec | null)[]): number | null {
  const text = st.target.text;
  const levels: ((i: number) => boolean)[] = [
    (i) => shows[i].label !== null && shows[i].label?.text === text,
    (i) => shows[i].label === null && (traces[i]?.label ?? labelOf(shows[i])) === text,
    (i) => (shows[i].mode === 'plain' ? shows[i].exprText : `${shows[i].mode} ${shows[i].exprText}`) === text,
    (i) => shows[i].exprText === text,
    (i) => shows[i].mode !== 'plain' && shows[i].mode === text,
  ];
  if (st.target.quoted) levels.splice(2);
  for (const level of levels) {
    const found = shows.map((_, i) => i).filter(level);
    if (found.length === 0) continue;
    if (found.length > 1) {
      cx.error(
        st.target.range,
        'ambiguous-target',
        `${text} could be the trace on line ${shows[found[0]].range.line} or on line ${shows[found[1]].range.line}`,
        'give the trace a label in quotes and require it by that label',
      );
      return null;
    }
    const i = found[0];
    if (traces[i] === null) return null; // its show line had an error
    return i;
  }
  if (shows.some((s, i) => traces[i] === null && (labelOf(s) === text || s.exprText === text)) || cx.program.brokenWords.has(text)) return null;
  const names = traces.filter((t): t is TraceSpec => t !== null).map((t) => t.label);
  const near = cx.near(text, names);
  cx.error(
    st.target.range,
    'unknown-target',
    shows.length === 0 ? `there is no trace called ${text}: this cell shows nothing` : `there is no trace called ${text}`,
    suggestionHint(
      near,
      undefined,
      shows.length === 0 ? `add show ${text}` : `the traces are ${names.join(', ')}; a requirement names a trace’s label or what its show line shows`,
    ),
    st.target.quoted ? undefined : near.fix,
  );
  return null;
}

/** Whether the requirement's `over` or `at` fits where its measure is read; reports it when not. */
function placeFits(cx: Elaboration, st: RequireStatement, measure: Measure, where: MeasureWhere): boolean {
  const write = (rest: string) => `write require ${st.target.text} ${measure} ${st.op.op} VALUE${rest}`;
  if (where === 'band' && st.over === null) {
    cx.error(st.at?.range ?? st.range, 'missing-range', `${measure} is measured over a band, so it needs one`, write(' over F1 .. F2'));
    return false;
  }
  if (where === 'at' && st.at === null) {
    const one = measure === 'value' ? 'time' : 'frequency';
    cx.error(st.over?.range ?? st.range, `missing-${one}`, `${measure} is read at one ${one}, so it needs one`, write(measure === 'value' ? ' at T' : ' at F'));
    return false;
  }
  if ((where === 'trace' && (st.over !== null || st.at !== null)) || (where === 'within' && st.at !== null)) {
    const range = st.over?.range ?? (st.at as Value).range;
    const what = where === 'trace' ? 'one number for the whole trace, so it takes no range' : 'found within a range, not at one frequency';
    cx.error(range, 'not-pointwise', `${measure} is ${what}`, write(where === 'within' ? ' [over F1 .. F2]' : ''));
    return false;
  }
  return true;
}

/** The trace a measure of one kind of trace needs, as messages say it. */
const TRACE_NEEDED = {
  loop: { article: 'a loop gain', how: 'show the loop gain with show loop EXPR' },
  step: { article: 'a step response', how: 'show the step response with show step EXPR' },
  impedance: { article: 'an impedance', how: 'show the impedance with show impedance NODE' },
} as const;

/** Units a requirement's value may carry, by measure and the trace's kind. */
function measureSlot(measure: Measure, trace: TraceSpec): Slot {
  const unit = MEASURES[measure];
  if (unit === null) {
    const units: Unit[] =
      trace.unit === 'Ω' || trace.unit === 'V/A'
        ? ['Ω']
        : trace.unit === 'A/V' || trace.unit === 'A/A' || trace.unit === 'A'
          ? ['A']
          : trace.unit === 'V/√Hz' || trace.unit === 'V'
            ? ['V']
            : [];
    return { says: `the magnitude of ${trace.label} is in ${trace.unit}`, units, unit: trace.unit };
  }
  const { in: written, units, example } = MEASURE_UNIT_WORDS[unit];
  return { says: `${measure} is ${written}`, units, unit: unit === 'deg' ? '°' : unit, example };
}

/** How a measure's unit is said in messages, the units its value may be written in, and an example value. */
const MEASURE_UNIT_WORDS: Record<Exclude<(typeof MEASURES)[Measure], null>, { in: string; units: Unit[]; example: string }> = {
  dB: { in: 'in dB', units: ['dB'], example: '-3 dB' },
  deg: { in: 'in degrees', units: ['deg'], example: '45°' },
  s: { in: 'a time, in s', units: ['s'], example: '1m' },
  Hz: { in: 'a frequency, in Hz', units: ['Hz'], example: '1k' },
  '%': { in: 'in %', units: ['%'], example: '5%' },
  Ω: { in: 'an impedance, in Ω', units: ['Ω'], example: '100m' },
  'dB/decade': { in: 'a slope, in dB/decade', units: ['dB'], example: '-40' },
  '': { in: 'a plain number', units: [], example: '5' },
};
