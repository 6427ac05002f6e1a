/**
 * The one place the API asks the solver about a circuit cell's text: the compile pool's
 * workers run it for saves (cell-check-pool.ts), and the migration that rewrites old forms
 * runs it directly (so it sits below both services and db). A save is never refused for what
 * the solver finds, only for going past the server's budget: the counts travel with the
 * answer and the revision.
 */
import { DEFAULT_MAX_POINTS, compile } from '@rolloff/solver';
import type { DiagnosticCounts } from './contract/common.js';

/** Caps a sweep the check elaborates (the solver's own limit), so a save never waits on a huge frequency list. */
const maxPoints = DEFAULT_MAX_POINTS;

/** What the check of one circuit text finds. */
export interface CircuitCheck {
  counts: DiagnosticCounts;
  /** The labels of the traces the text shows (as its plots name them), or null when it has errors and so shows none. */
  traces: string[] | null;
  /** Whether the network has more than `maxParts` parts once its blocks are expanded. */
  tooLarge: boolean;
}

/** Compiles `text` as a circuit cell (parse + elaborate, no solve); `maxParts` defaults to the solver's cap. */
export function checkCircuit(text: string, maxParts?: number): CircuitCheck {
  try {
    const { circuit, diagnostics } = compile(text, { maxPoints, maxParts });
    let errors = 0;
    let warnings = 0;
    for (const diagnostic of diagnostics) {
      if (diagnostic.severity === 'error') errors++;
      // An `info` diagnostic is a caution about the circuit, not a problem of the cell.
      else if (diagnostic.severity === 'warning') warnings++;
    }
    return {
      counts: { errors, warnings },
      traces: circuit?.traces.map((trace) => trace.label) ?? null,
      tooLarge: diagnostics.some((diagnostic) => diagnostic.code === 'network-too-large'),
    };
  } catch (error) {
    // compile() promises never to throw; if it does, the text still saves, counted as one error.
    console.error('cell check failed:', error);
    return { counts: { errors: 1, warnings: 0 }, traces: null, tooLarge: false };
  }
}

/** Error and warning counts of `text` as a circuit cell. */
export function checkCircuitText(text: string): DiagnosticCounts {
  return checkCircuit(text).counts;
}
