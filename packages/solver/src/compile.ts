/**
 * From a cell's text to the network the numerical core solves: parse, elaborate (each
 * variant too, with a `vary` line), and add the cell's cautions. This is what `analyze()`
 * calls. Never throws.
 */
import type { Circuit } from './circuit.js';
import type { Diagnostic } from './result.js';
import { parse } from './parser/index.js';
import { elaborate } from './elaborate/index.js';
import { internalError, tidyDiagnostics } from './diagnostic.js';
import { cautions } from './cautions.js';
import { compileVariants } from './variants.js';
import type { CompiledVariant } from './variants.js';

export interface CompileOptions {
  /** Most frequency points a sweep may have (default `DEFAULT_MAX_POINTS`). */
  maxPoints?: number;
  /** Most parts the network may have once its blocks are expanded (default `DEFAULT_MAX_PARTS`). */
  maxParts?: number;
}

export interface Compiled {
  circuit: Circuit | null;
  diagnostics: Diagnostic[];
  /** With a `vary` line (and no error): each variant's network, in the order of its values. */
  variants?: CompiledVariant[];
}

/**
 * Parses and elaborates a cell. `circuit` is null when there is any error; warnings come
 * with a circuit. Diagnostics are sorted by place, each range inside the text.
 */
export function compile(text: string, options: CompileOptions = {}): Compiled {
  const source = typeof text === 'string' ? text : String(text);
  try {
    const parsed = parse(source);
    const limits = { maxPoints: options.maxPoints, maxParts: options.maxParts };
    const elaborated = elaborate(parsed.program, limits);
    const built =
      elaborated.circuit !== null && elaborated.vary !== undefined ? compileVariants(parsed.program, elaborated.vary, elaborated.diagnostics, limits) : null;
    // A variant's drive may be the one that is hazardous: the first caution any network gives.
    const networks = [elaborated.circuit, ...(built?.variants.map((v) => v.circuit) ?? [])];
    const caution = networks.map((c) => cautions(source, c)).find((list) => list.length > 0) ?? [];
    const diagnostics = tidyDiagnostics([...parsed.diagnostics, ...elaborated.diagnostics, ...(built?.diagnostics ?? []), ...caution], source);
    if (diagnostics.some((d) => d.severity === 'error')) return { circuit: null, diagnostics };
    return built === null ? { circuit: elaborated.circuit, diagnostics } : { circuit: elaborated.circuit, diagnostics, variants: built.variants };
  } catch (e) {
    return { circuit: null, diagnostics: tidyDiagnostics([internalError(e)], source) };
  }
}
