/**
 * The one place the API asks the solver about a circuit cell's text, for saves and for the
 * migration that rewrites old forms (so it sits below both services and db). A save is never
 * refused for what the solver finds: the counts only travel with the answer and the revision.
 */
import { DEFAULT_MAX_POINTS, compile } from '@rolloff/solver';
import type { DiagnosticCounts } from './contract/common.js';

/** Caps a sweep the check elaborates (the solver's own limit), so a save never waits on a huge frequency list. */
const maxPoints = DEFAULT_MAX_POINTS;

/** Error and warning counts of `text` as a circuit cell (compile: parse + elaborate, no solve). */
export function checkCircuitText(text: string): DiagnosticCounts {
  try {
    const { diagnostics } = compile(text, { maxPoints });
    let errors = 0;
    let warnings = 0;
    for (const diagnostic of diagnostics) {
      if (diagnostic.severity === 'error') errors++;
      // An `info` diagnostic is a caution about the circuit, not a problem of the cell.
      else if (diagnostic.severity === 'warning') warnings++;
    }
    return { errors, warnings };
  } catch (error) {
    // compile() promises never to throw; if it does, the text still saves, counted as one error.
    console.error('cell check failed:', error);
    return { errors: 1, warnings: 0 };
  }
}

/**
 * The labels of the traces a circuit cell's text shows (as its plots name them), or null when
 * the text has errors and so shows none.
 */
export function shownTraces(text: string): string[] | null {
  try {
    return compile(text, { maxPoints }).circuit?.traces.map((trace) => trace.label) ?? null;
  } catch (error) {
    console.error('cell check failed:', error);
    return null;
  }
}

/** Diagnostic counts for a cell of either kind: null for note cells, which are not checked. */
export function checkCell(kind: 'circuit' | 'note', text: string): DiagnosticCounts | null {
  return kind === 'circuit' ? checkCircuitText(text) : null;
}
