/**
 * Every `show step` trace of a cell: the window (the `time` line, or about ten times the
 * slowest time constant), one integration for all of them, the value each settles to (an
 * exact DC solve), and the diagnostics of what could not be computed.
 */
import type { Circuit, TraceSpec } from './circuit.js';
import type { MnaSystem } from './mna.js';
import type { Diagnostic, StepResult } from './result.js';
import { createLinearSolver } from './linear-solver.js';
import { descriptorSystem, readStep } from './time-system.js';
import type { DescriptorSystem, StepReader } from './time-system.js';
import { diagnostic, internalError } from './diagnostic.js';
import { RELATIVE_TOLERANCE, integrateStep } from './time-response.js';
import { naturalTime } from './time-window.js';
import { formatSi } from './units.js';

/** Time points of a window without a count. */
export const DEFAULT_TIME_POINTS = 1001;
/** The default window in time constants. */
const WINDOW_TIME_CONSTANTS = 10;
/** The window of a network without a time constant, in s. */
const FALLBACK_WINDOW = 1;

/** One step trace with what its readouts and requirements need. */
export interface StepData {
  spec: TraceSpec;
  /** Index into `Circuit.traces`. */
  specIndex: number;
  result: StepResult;
  /** The value it settles to, or why it has none. */
  final: { value: number } | { reason: string };
  /** The value at each extra time asked for (a requirement's `at`), by time. */
  at: Map<number, number>;
  /**
   * The values at `points` + 1 evenly spaced times from t0, a time of the window or of an
   * earlier sample, to t1, solved there (for readouts found between time points); null where
   * the integration fails.
   */
  sample(t0: number, t1: number, points: number): { times: number[]; values: number[] } | null;
}

/** Grid states are kept for samples up to this many numbers in all; above it a sample integrates from 0 again. */
const KEPT_STATE_NUMBERS = 2_000_000;
/** Sample states kept for later samples to start from. */
const KEPT_SAMPLES = 256;

/**
 * Solves every step trace of the circuit. `extraTimes` are instants (s) whose values are
 * wanted exactly besides the window's points.
 */
export function solveSteps(circuit: Circuit, mna: MnaSystem, extraTimes: number[] = []): { steps: StepData[]; diagnostics: Diagnostic[] } {
  const specs = circuit.traces.map((spec, specIndex) => ({ spec, specIndex })).filter((t) => t.spec.kind === 'step');
  if (specs.length === 0) return { steps: [], diagnostics: [] };
  const diagnostics: Diagnostic[] = [];
  const { system, readers } = descriptorSystem(
    mna,
    specs.map((t) => t.spec.probe),
  );
  const natural = naturalTime(system);
  const first = specs[0].spec.range;
  let window = circuit.time;
  if (window === null) {
    if (natural.tau === null) {
      diagnostics.push(
        diagnostic(
          first,
          'no-time-constant',
          `this network has no time constant the drive excites, so the step is shown over 0 .. ${formatSi(FALLBACK_WINDOW, 's')}`,
          {
            severity: 'info',
            hint: 'set the window with a time line, like time 0 .. 10m',
          },
        ),
      );
      window = { from: 0, to: FALLBACK_WINDOW };
    } else window = { from: 0, to: WINDOW_TIME_CONSTANTS * natural.tau };
  }
  const count = window.points ?? DEFAULT_TIME_POINTS;
  const times = new Float64Array(count);
  for (let k = 0; k < count; k++) times[k] = k === count - 1 ? window.to : window.from + ((window.to - window.from) * k) / (count - 1);
  const extras = [...new Set(extraTimes.filter((t) => t >= 0))];
  const all = Float64Array.from(new Set([...times, ...extras])).sort();
  const height = stepHeight(circuit);
  const values = specs.map(() => new Float64Array(count).fill(NaN));
  const at = specs.map(() => new Map<number, number>());
  const gridIndex = new Map(Array.from(times, (t, k) => [t, k]));
  const extraSet = new Set(extras);
  const keep = system.n * all.length <= KEPT_STATE_NUMBERS;
  const states = new Map<number, Float64Array>();
  const run = integrateStep(system, all, (k, z) => {
    const t = all[k];
    if (keep) states.set(t, z);
    const g = gridIndex.get(t);
    readers.forEach((reader, r) => {
      if (reader === null) return;
      const v = scaled(reader, z, height);
      if (g !== undefined) values[r][g] = v;
      if (extraSet.has(t)) at[r].set(t, v);
    });
  });
  if (run.ok && run.tolerance > RELATIVE_TOLERANCE) {
    diagnostics.push(
      diagnostic(
        first,
        'step-tolerance',
        `the step response rings for so long in its window that it is computed to about ${run.tolerance.toExponential(0)} of its size, not 1e-9`,
        {
          severity: 'info',
          hint: 'a shorter time window is computed more exactly',
        },
      ),
    );
  }
  if (!run.ok) {
    diagnostics.push(
      diagnostic(first, 'step-failed', `the step response stops early: ${run.reason}`, { severity: 'warning', hint: 'the points after that have no value' }),
    );
  }
  const dc = finalState(system);
  const samples = new Map<number, Float64Array>();
  const stateAt = (t0: number): Float64Array | null => {
    const kept = states.get(t0) ?? samples.get(t0);
    if (kept) return kept;
    let z: Float64Array | null = null;
    return integrateStep(system, [t0], (_, state) => (z = state)).ok ? z : null;
  };
  const sample = (reader: StepReader | null, t0: number, t1: number, points: number): { times: number[]; values: number[] } | null => {
    if (reader === null) return null;
    // The state kept for 0 is the one just after the step, reached a moment later: from 0 start again.
    const start = t0 > 0 ? stateAt(t0) : undefined;
    if (start === null) return null;
    const at = Array.from({ length: points + 1 }, (_, j) => (j === points ? t1 : t0 + ((t1 - t0) * j) / points));
    const values: number[] = [];
    const ok = integrateStep(
      system,
      at,
      (j, z) => {
        if (samples.size >= KEPT_SAMPLES) samples.delete(samples.keys().next().value as number);
        samples.set(at[j], z);
        values.push(scaled(reader, z, height));
      },
      start && { t: t0, z: start },
    ).ok;
    return ok ? { times: at, values } : null;
  };
  const steps = specs.map(({ spec, specIndex }, r): StepData => {
    const reader = readers[r];
    // The elaborator checked every step probe: a probe without a reader is a broken invariant.
    if (reader === null) diagnostics.push(internalError(new Error(`${spec.label} cannot be read in the time domain`), spec.range));
    const result: StepResult = { label: spec.label, expr: spec.expr, unit: spec.unit, times, values: values[r] };
    return {
      spec,
      specIndex,
      result,
      final: finalValue(reader, dc, height, natural.growing, values[r]),
      at: at[r],
      sample: (t0, t1, points) => sample(reader, t0, t1, points),
    };
  });
  return { steps, diagnostics };
}

/** The step's height: the drive's amplitude, turned over by a phase of 180°. */
function stepHeight(circuit: Circuit): number {
  const drive = circuit.drive;
  if (!drive) return 1;
  return Math.cos((drive.phaseDeg * Math.PI) / 180) < 0 ? -drive.amplitude : drive.amplitude;
}

/** A reader's value for a step of `height`: a ratio of two node voltages does not scale. */
function scaled(reader: StepReader, z: Float64Array, height: number): number {
  const v = readStep(reader, z);
  return reader.den === null ? v * height : v;
}

/** The state the step settles to, F·z = b (the network at 0 Hz); null where that is singular. */
function finalState(system: DescriptorSystem): Float64Array | null {
  const { n, rows, cols, f, b } = system;
  const fact = createLinearSolver(n, rows, cols).factor(f, new Float64Array(f.length));
  if (fact.singular) return null;
  const z = new Float64Array(n);
  fact.solve(b, new Float64Array(n), z, new Float64Array(n));
  return z;
}

function finalValue(reader: StepReader | null, dc: Float64Array | null, height: number, growing: boolean, values: Float64Array): StepData['final'] {
  if (reader === null) return { reason: 'the trace has no value' };
  if (dc === null) return { reason: 'it has no final value: the network integrates the drive (no path for DC), so the response keeps changing' };
  const value = scaled(reader, dc, height);
  if (!Number.isFinite(value)) return { reason: 'it has no final value' };
  const last = values[values.length - 1];
  if (growing && !(Math.abs(last - value) <= 0.01 * Math.abs(value)))
    return { reason: 'it has no final value: the response grows, so the network is unstable' };
  return { value };
}
