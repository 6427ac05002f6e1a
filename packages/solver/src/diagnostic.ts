/** Making diagnostics, and keeping every range inside the text it speaks of. */
import type { SourceRange } from './circuit.js';
import type { Diagnostic, QuickFix, Severity } from './result.js';

export interface FixSpec {
  title: string;
  replacement: string;
  /** Where to replace; the diagnostic's own range when absent. */
  range?: SourceRange;
}

/** The quick fix that replaces the diagnostic's range (or `range`) with `replacement`. */
export function replaceWith(replacement: string, range?: SourceRange): FixSpec {
  return range === undefined ? { title: `Replace with ${replacement}`, replacement } : { title: `Replace with ${replacement}`, replacement, range };
}

/** One diagnostic at `range`. */
export function diagnostic(range: SourceRange, code: string, message: string, options: { hint?: string; fix?: FixSpec; severity?: Severity } = {}): Diagnostic {
  const d: Diagnostic = {
    severity: options.severity ?? 'error',
    line: range.line,
    column: range.column,
    endColumn: range.endColumn,
    message,
    code,
  };
  if (options.hint !== undefined) d.hint = options.hint;
  if (options.fix !== undefined) {
    const r = options.fix.range ?? range;
    const fix: QuickFix = { title: options.fix.title, line: r.line, column: r.column, endColumn: r.endColumn, replacement: options.fix.replacement };
    d.fix = fix;
  }
  return d;
}

/** The code of `internalError`. */
export const INTERNAL_ERROR = 'internal-error';

/**
 * The one diagnostic for a fault of Rolloff's own (an exception or a broken invariant), so
 * that a caller still gets an answer, not a throw: at `range` when the fault belongs to one
 * line, else at the cell's start.
 */
export function internalError(e: unknown, range?: SourceRange): Diagnostic {
  const why = e instanceof Error ? e.message : String(e);
  const what = range === undefined ? 'the cell' : 'this line';
  return diagnostic(range ?? { line: 1, column: 1, endColumn: 1 }, INTERNAL_ERROR, `${what} could not be read because of a fault in Rolloff (${why})`, {
    hint: 'please report this cell to the Rolloff team',
  });
}

/**
 * Clamps every range into the text (lines 1..n, columns 1..length+1), widens an empty
 * range on a non-empty line to one character so that an editor can show it, drops exact
 * repeats (a block used twice reports a problem in its body once), and sorts by place.
 */
export function tidyDiagnostics(diagnostics: readonly Diagnostic[], text: string): Diagnostic[] {
  const lines = text.split(/\r\n|\r|\n/);
  const seen = new Set<string>();
  const out: Diagnostic[] = [];
  for (const d of diagnostics) {
    const c = { ...d };
    clamp(c, lines, true);
    if (c.fix !== undefined) {
      const f = { ...c.fix };
      clamp(f, lines, false);
      c.fix = f;
    }
    const key = `${c.severity}|${c.line}|${c.column}|${c.endColumn}|${c.code}|${c.message}`;
    if (seen.has(key)) continue;
    seen.add(key);
    out.push(c);
  }
  out.sort((a, b) => a.line - b.line || a.column - b.column || (a.severity === b.severity ? 0 : a.severity === 'error' ? -1 : 1));
  return out;
}

function clamp(r: { line: number; column: number; endColumn: number }, lines: string[], widen: boolean): void {
  const lineCount = Math.max(1, lines.length);
  r.line = Math.min(Math.max(1, Math.trunc(r.line) || 1), lineCount);
  const length = (lines[r.line - 1] ?? '').length;
  r.column = Math.min(Math.max(1, Math.trunc(r.column) || 1), length + 1);
  r.endColumn = Math.min(Math.max(r.column, Math.trunc(r.endColumn) || r.column), length + 1);
  if (widen && r.endColumn === r.column && length > 0) {
    if (r.column <= length) r.endColumn = r.column + 1;
    else r.column = r.endColumn - 1;
  }
}
