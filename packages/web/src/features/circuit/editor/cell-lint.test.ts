import { EditorState, Text } from '@codemirror/state';
import type { EditorView } from '@codemirror/view';
import { analyze } from '@rolloff/solver';
import type { Diagnostic } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { toLintDiagnostics } from './cell-lint';

/** A stand-in for the view that applies dispatched changes to a state. */
function fakeView(doc: string) {
  const holder = { state: EditorState.create({ doc }) };
  const view = {
    get state() {
      return holder.state;
    },
    dispatch: (spec: Parameters<EditorState['update']>[0]) => {
      holder.state = holder.state.update(spec).state;
    },
  };
  return view as unknown as EditorView;
}

describe('solver diagnostics in the editor', () => {
  it('places each diagnostic on the columns the solver names', () => {
    const doc = Text.of(['let R = 10k', 'R1 [in out] Rx']);
    const diagnostic: Diagnostic = {
      severity: 'error',
      line: 2,
      column: 13,
      endColumn: 15,
      message: 'Rx is not defined',
      hint: 'did you mean R?',
      code: 'undefined-name',
    };
    const [lint] = toLintDiagnostics(doc, [diagnostic]);
    expect(doc.sliceString(lint.from, lint.to)).toBe('Rx');
    expect(lint.severity).toBe('error');
    expect(lint.message).toContain('did you mean R?');
  });

  it('widens an empty range so the underline can be seen', () => {
    const doc = Text.of(['show']);
    const [lint] = toLintDiagnostics(doc, [{ severity: 'warning', line: 1, column: 5, endColumn: 5, message: 'show what?', code: 'x' }]);
    expect(lint.to - lint.from).toBe(1);
  });

  it("applies the solver's quick fix for a misspelt mega and the error goes away", () => {
    const broken = FIRST_EXAMPLE.replace('gbw 1M', 'gbw 1meg');
    const diagnostics = analyze(broken).diagnostics;
    const withFix = diagnostics.find((d) => d.fix);
    expect(withFix).toBeDefined();
    const view = fakeView(broken);
    const lint = toLintDiagnostics(view.state.doc, diagnostics).find((l) => l.actions?.length);
    lint?.actions?.[0].apply(view, lint.from, lint.to);
    const fixed = view.state.doc.toString();
    expect(fixed).not.toBe(broken);
    expect(analyze(fixed).diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });
});
