/**
 * The step traces' share of a Result: the traces themselves, their readouts, and the results
 * of the requirements on them (which `checkRequirements` leaves to this module), with a note
 * on each trace line that names the readouts it cannot have and why.
 */
import type { Circuit, RequirementSpec } from './circuit.js';
import type { MnaSystem } from './mna.js';
import type { Diagnostic, Readout, ReadoutId, RequirementResult, StepResult } from './result.js';
import { diagnostic } from './diagnostic.js';
import { solveSteps } from './steps.js';
import type { StepData } from './steps.js';
import { stepMeasures } from './step-measures.js';
import type { StepMeasure, StepMeasures } from './step-measures.js';
import { formatSi } from './units.js';

/** Each step readout, the measure it is read from and its unit (null: the trace's own). */
const STEP_READOUTS: readonly { id: ReadoutId; of: keyof StepMeasures; unit: string | null }[] = [
  { id: 'final', of: 'final', unit: null },
  { id: 't63', of: 't63', unit: 's' },
  { id: 'rise-time', of: 'riseTime', unit: 's' },
  { id: 'settling', of: 'settling', unit: 's' },
  { id: 'overshoot', of: 'overshoot', unit: '%' },
];

/** The requirement measures read off a step readout. */
const MEASURE_READOUT: Readonly<Record<string, keyof StepMeasures>> = {
  final: 'final',
  t63: 't63',
  'rise-time': 'riseTime',
  settling: 'settling',
  overshoot: 'overshoot',
};

export interface StepResults {
  steps: StepResult[];
  readouts: Readout[];
  /** `requirements` with those on step traces checked. */
  requirements: RequirementResult[];
  diagnostics: Diagnostic[];
}

/** Solves the step traces and checks their requirements; `requirements` are the cell's, in order. */
export function analyzeSteps(circuit: Circuit, mna: MnaSystem, requirements: RequirementResult[]): StepResults {
  const onStep = (req: RequirementSpec): boolean => circuit.traces[req.trace]?.kind === 'step';
  const instants = circuit.requirements.filter((req) => onStep(req) && req.measure === 'value' && req.at !== undefined).map((req) => req.at as number);
  const { steps, diagnostics } = solveSteps(circuit, mna, instants);
  const measures = steps.map(stepMeasures);
  const readouts: Readout[] = [];
  steps.forEach((step, i) => {
    const missing: string[] = [];
    for (const r of STEP_READOUTS) {
      const m = measures[i][r.of];
      if ('value' in m) readouts.push({ trace: step.spec.label, name: r.id, value: m.value, unit: r.unit ?? step.spec.unit, at: null });
      else missing.push(`${r.id}: ${m.reason}`);
    }
    if (missing.length > 0) {
      diagnostics.push(
        diagnostic(step.spec.range, 'step-readouts', `${step.spec.label} has no ${missing.map((m) => m.split(':')[0]).join(', ')}`, {
          severity: 'info',
          hint: [...new Set(missing.map((m) => m.slice(m.indexOf(':') + 2)))].join('; '),
        }),
      );
    }
  });
  const checked = requirements.map((result, r) => {
    const req = circuit.requirements[r];
    if (!req || !onStep(req)) return result;
    const k = steps.findIndex((s) => s.specIndex === req.trace);
    if (k < 0) return result;
    const measured = req.measure === 'value' ? valueAt(steps[k], req.at) : measureOf(measures[k], req.measure);
    const base = { ...result, over: null, at: req.at ?? null, worstAt: null };
    if ('reason' in measured) {
      diagnostics.push(diagnostic(req.range, 'requirement-not-checked', `${measured.reason}; this requirement is not checked`, { severity: 'warning' }));
      return { ...base, status: 'not-applicable' as const, measured: NaN, reason: measured.reason };
    }
    const { low, high } = result.band;
    const pass = !Number.isNaN(measured.value) && (low === null || measured.value >= low) && (high === null || measured.value <= high);
    return { ...base, status: pass ? ('pass' as const) : ('fail' as const), measured: measured.value, reason: null };
  });
  return { steps: steps.map((s) => s.result), readouts, requirements: checked, diagnostics };
}

function measureOf(m: StepMeasures, measure: string): StepMeasure {
  const of = MEASURE_READOUT[measure];
  return of === undefined ? { reason: `${measure} is not measured on a step response` } : m[of];
}

/** The response at one instant, solved exactly there. */
function valueAt(step: StepData, at: number | undefined): StepMeasure {
  if (at === undefined) return { reason: 'value needs a time: write at T' };
  const v = step.at.get(at);
  if (v === undefined || !Number.isFinite(v)) return { reason: `the response has no value at ${formatSi(at, 's')}` };
  return { value: v, at };
}
