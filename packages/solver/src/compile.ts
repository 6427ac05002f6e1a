/**
 * From a cell's text to the network the numerical core solves: parse, elaborate, and add
 * the cell's cautions. This is what `analyze()` calls. Never throws.
 */
import type { Circuit } from './circuit.js';
import type { Diagnostic } from './result.js';
import { parse } from './parser/index.js';
import { elaborate } from './elaborate/index.js';
import { internalError, tidyDiagnostics } from './diagnostic.js';
import { cautions } from './cautions.js';

export interface CompileOptions {
  /** Most frequency points a sweep may have (default `DEFAULT_MAX_POINTS`). */
  maxPoints?: number;
  /** Most parts the network may have once its blocks are expanded (default `DEFAULT_MAX_PARTS`). */
  maxParts?: number;
}

/**
 * Parses and elaborates a cell. `circuit` is null when there is any error; warnings come
 * with a circuit. Diagnostics are sorted by place, each range inside the text.
 */
export function compile(text: string, options: CompileOptions = {}): { circuit: Circuit | null; diagnostics: Diagnostic[] } {
  const source = typeof text === 'string' ? text : String(text);
  try {
    const parsed = parse(source);
    const elaborated = elaborate(parsed.program, { maxPoints: options.maxPoints, maxParts: options.maxParts });
    const diagnostics = tidyDiagnostics([...parsed.diagnostics, ...elaborated.diagnostics, ...cautions(source, elaborated.circuit)], source);
    const failed = diagnostics.some((d) => d.severity === 'error');
    return { circuit: failed ? null : elaborated.circuit, diagnostics };
  } catch (e) {
    return { circuit: null, diagnostics: tidyDiagnostics([internalError(e)], source) };
  }
}
