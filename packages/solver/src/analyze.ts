/**
 * `analyze(text)`: the cell's text in, everything a screen draws out. Compiles the text,
 * solves the network over its sweep, reads off the readouts and checks the requirements.
 * Never throws: an internal failure becomes an error diagnostic.
 */
import type { Circuit } from './circuit.js';
import type { Diagnostic, Result } from './result.js';
import { compile } from './compile.js';
import { solveCircuit } from './analysis.js';
import type { SolveOptions } from './analysis.js';
import { computeReadouts } from './readouts.js';
import { checkRequirements } from './requirements.js';
import { analyzeSteps } from './step-results.js';
import { traceDiagnostics } from './trace-checks.js';
import { internalError } from './diagnostic.js';
import { combineVariants, pointShare } from './variants.js';
import type { CompiledVariant } from './variants.js';

export interface AnalyzeOptions {
  /** The most sweep points a cell may ask for (and the default sweep may use). */
  maxPoints?: number;
  /** The most parts the network may have once its blocks are expanded. */
  maxParts?: number;
}

/** Compile and analyse one cell. */
export function analyze(text: string, options: AnalyzeOptions = {}): Result {
  try {
    const compiled = compile(text, { maxPoints: options.maxPoints, maxParts: options.maxParts });
    const diagnostics = [...compiled.diagnostics];
    if (!compiled.circuit || diagnostics.some((d) => d.severity === 'error')) return emptyResult(diagnostics);
    const solved = compiled.variants ? analyzeVariants(compiled.variants, options) : analyzeCircuit(compiled.circuit, options);
    solved.diagnostics = [...diagnostics, ...solved.diagnostics].sort((a, b) => a.line - b.line || a.column - b.column);
    return solved;
  } catch (error) {
    return emptyResult([internalError(error)]);
  }
}

/** Analyse an already elaborated network (what `analyze` does after compiling). */
export function analyzeCircuit(circuit: Circuit, options: AnalyzeOptions & SolveOptions = {}): Result {
  try {
    const { analysis, diagnostics } = solveCircuit(circuit, options);
    if (!analysis) {
      const result = emptyResult(diagnostics);
      return result;
    }
    const perTrace = analysis.traces.map((t) => computeReadouts(analysis, t));
    const checked = checkRequirements(circuit, analysis, perTrace);
    const timed = analyzeSteps(circuit, analysis.evaluator.system, checked.results);
    return {
      diagnostics: [...diagnostics, ...traceDiagnostics(circuit, analysis), ...checked.diagnostics, ...timed.diagnostics],
      frequencies: analysis.frequencies,
      traces: analysis.traces.map((t) => t.result),
      readouts: [...perTrace.flatMap((r) => r.readouts), ...timed.readouts],
      requirements: timed.requirements,
      steps: timed.steps,
      poles: [],
      zeros: [],
      envelope: [],
    };
  } catch (error) {
    return emptyResult([internalError(error)]);
  }
}

/**
 * Every variant solved on its own, each within an equal share of the point limit (the
 * `vary` line has checked that a written sweep fits; a default sweep is thinned to fit).
 */
function analyzeVariants(variants: CompiledVariant[], options: AnalyzeOptions): Result {
  const maxPoints = pointShare(options.maxPoints, variants.length);
  const results = variants.map((v) => analyzeCircuit(v.circuit, { ...options, maxPoints }));
  const unsolved = results.find((r) => r.frequencies.length === 0 && r.diagnostics.length > 0);
  return unsolved ?? combineVariants(variants, results);
}

function emptyResult(diagnostics: Diagnostic[]): Result {
  return { diagnostics, frequencies: new Float64Array(0), traces: [], readouts: [], requirements: [], steps: [], poles: [], zeros: [], envelope: [] };
}
