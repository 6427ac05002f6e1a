/**
 * The solver's diagnostics as CodeMirror lint diagnostics: underlines with the message and
 * hint on hover, and the diagnostic's quick fix as an action the user can click.
 */
import type { Diagnostic as LintDiagnostic } from '@codemirror/lint';
import type { Text } from '@codemirror/state';
import type { Diagnostic } from '@rolloff/solver';

/** Offset in `doc` of a 1-based line and column, clamped to the line. */
function offsetOf(doc: Text, line: number, column: number): number {
  const at = doc.line(Math.min(Math.max(1, line), doc.lines));
  return Math.min(at.to, at.from + Math.max(0, column - 1));
}

function renderMessage(diagnostic: Diagnostic): () => Node {
  return () => {
    const box = document.createElement('div');
    box.className = 'cm-rolloff-diagnostic';
    const message = document.createElement('div');
    message.textContent = diagnostic.message;
    box.append(message);
    if (diagnostic.hint) {
      const hint = document.createElement('div');
      hint.className = 'cm-rolloff-hint';
      hint.textContent = diagnostic.hint;
      box.append(hint);
    }
    return box;
  };
}

/**
 * Turns diagnostics computed for `doc` into lint diagnostics. A diagnostic of zero width is
 * widened to the next character (or the one before at a line end) so it can be seen.
 */
export function toLintDiagnostics(doc: Text, diagnostics: readonly Diagnostic[]): LintDiagnostic[] {
  return diagnostics.map((diagnostic) => {
    let from = offsetOf(doc, diagnostic.line, diagnostic.column);
    let to = Math.max(from, offsetOf(doc, diagnostic.line, diagnostic.endColumn));
    if (from === to) {
      const line = doc.lineAt(from);
      if (to < line.to) to += 1;
      else if (from > line.from) from -= 1;
    }
    const lint: LintDiagnostic = {
      from,
      to,
      severity: diagnostic.severity,
      source: diagnostic.code,
      message: diagnostic.hint ? `${diagnostic.message} — ${diagnostic.hint}` : diagnostic.message,
      renderMessage: renderMessage(diagnostic),
    };
    const fix = diagnostic.fix;
    if (fix) {
      // The fix is kept relative to the diagnostic, whose position CodeMirror maps through later edits.
      const fixFrom = offsetOf(doc, fix.line, fix.column) - from;
      const fixTo = offsetOf(doc, fix.line, fix.endColumn) - from;
      lint.actions = [
        {
          name: fix.title,
          apply: (view, currentFrom) => {
            const start = Math.max(0, currentFrom + fixFrom);
            const end = Math.min(view.state.doc.length, Math.max(start, currentFrom + fixTo));
            view.dispatch({ changes: { from: start, to: end, insert: fix.replacement }, userEvent: 'input.quickfix' });
          },
        },
      ];
    }
    return lint;
  });
}
