/**
 * The solver's cautions (a cell at mains or another hazardous voltage) among its diagnostics:
 * the caution banner shows them, the list of the cell's problems does not repeat them.
 */
import { HAZARDOUS_VOLTAGE } from '@rolloff/solver';
import type { Diagnostic } from '@rolloff/solver';

/** The diagnostics the caution banner shows. */
export function cautionsOf(diagnostics: readonly Diagnostic[]): Diagnostic[] {
  return diagnostics.filter((d) => d.code === HAZARDOUS_VOLTAGE);
}

/** The diagnostics that are problems of the cell, for its list under the editor. */
export function problemsOf(diagnostics: readonly Diagnostic[]): Diagnostic[] {
  return diagnostics.filter((d) => d.code !== HAZARDOUS_VOLTAGE);
}

/** A solver message (lower-case, unpunctuated) written as a sentence on a screen. */
export function sentence(text: string): string {
  const capital = text.charAt(0).toUpperCase() + text.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}
