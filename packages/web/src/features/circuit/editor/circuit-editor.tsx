/**
 * The circuit-cell editor: CodeMirror with the cell language's colours, the solver's
 * diagnostics as underlines (message and hint on hover, quick fixes as actions), and
 * completion of the words and names of the cell. Loaded lazily (default export).
 */
import { autocompletion } from '@codemirror/autocomplete';
import { lintGutter, setDiagnostics } from '@codemirror/lint';
import { Prec } from '@codemirror/state';
import { EditorView, keymap } from '@codemirror/view';
import CodeMirror from '@uiw/react-codemirror';
import type { Diagnostic } from '@rolloff/solver';
import { useEffect, useMemo, useRef } from 'react';
import { cellCompletionSource } from './cell-completion';
import { cellLanguageSupport } from './cell-language';
import { toLintDiagnostics } from './cell-lint';

export interface CircuitEditorProps {
  value: string;
  onChange?: (text: string) => void;
  /** The newest diagnostics and the text they were computed for. */
  diagnostics: { text: string; items: readonly Diagnostic[] } | null;
  readOnly?: boolean;
  label: string;
  /** Shift-Enter: move on to the next cell. */
  onLeave?: () => void;
  autoFocus?: boolean;
}

const editorTheme = EditorView.theme({
  '&': { backgroundColor: 'var(--panel)', color: 'var(--ink)', fontSize: '14px', borderRadius: '0.5rem' },
  '&.cm-focused': { outline: '2px solid var(--focus)', outlineOffset: '1px' },
  '.cm-content': { fontFamily: 'var(--font-mono)', caretColor: 'var(--ink)', padding: '8px 0' },
  '.cm-gutters': { backgroundColor: 'var(--sunken)', color: 'var(--ink-faint)', border: 'none', borderRadius: '0.5rem 0 0 0.5rem' },
  '.cm-activeLine': { backgroundColor: 'color-mix(in srgb, var(--accent-soft) 45%, transparent)' },
  '.cm-activeLineGutter': { backgroundColor: 'var(--accent-soft)', color: 'var(--ink)' },
  '&.cm-focused .cm-selectionBackground, .cm-selectionBackground, ::selection': {
    backgroundColor: 'color-mix(in srgb, var(--accent) 28%, transparent) !important',
  },
  '.cm-cursor': { borderLeftColor: 'var(--ink)' },
  '.cm-tooltip': {
    backgroundColor: 'var(--panel)',
    color: 'var(--ink)',
    border: '1px solid var(--rule)',
    borderRadius: '0.375rem',
    fontFamily: 'var(--font-sans)',
  },
  '.cm-tooltip-autocomplete ul li[aria-selected]': { backgroundColor: 'var(--accent)', color: 'var(--accent-ink)' },
  '.cm-diagnostic': { padding: '4px 8px', borderLeftWidth: '4px' },
  '.cm-diagnostic-error': { borderLeftColor: 'var(--fail)' },
  '.cm-diagnostic-warning': { borderLeftColor: 'var(--warn)' },
  '.cm-rolloff-hint': { color: 'var(--ink-soft)', marginTop: '2px' },
  '.cm-diagnosticAction': { backgroundColor: 'var(--accent)', color: 'var(--accent-ink)', borderRadius: '0.25rem', padding: '1px 8px' },
  '.cm-lintRange-error': { backgroundImage: 'none', textDecoration: 'underline wavy var(--fail)', textUnderlineOffset: '3px' },
  '.cm-lintRange-warning': { backgroundImage: 'none', textDecoration: 'underline wavy var(--warn)', textUnderlineOffset: '3px' },
});

/** The editor of one circuit cell. */
export default function CircuitEditor({ value, onChange, diagnostics, readOnly = false, label, onLeave, autoFocus }: CircuitEditorProps) {
  const view = useRef<EditorView | null>(null);
  const leave = useRef(onLeave);
  leave.current = onLeave;

  const extensions = useMemo(
    () => [
      cellLanguageSupport(),
      // Enter ends the line unless the designer moved into the list (↓ or ↑) first, so typing a
      // value and pressing Enter never accepts a word that was merely offered.
      autocompletion({ override: [cellCompletionSource], activateOnTyping: true, selectOnOpen: false }),
      lintGutter(),
      EditorView.contentAttributes.of({ 'aria-label': label }),
      Prec.highest(keymap.of([{ key: 'Shift-Enter', run: () => (leave.current ? (leave.current(), true) : false) }])),
      EditorView.lineWrapping,
    ],
    [label],
  );

  useEffect(() => {
    const current = view.current;
    if (!current || !diagnostics) return;
    // Diagnostics of an older text would point at the wrong places; the newer ones are on their way.
    if (diagnostics.text !== current.state.doc.toString()) return;
    current.dispatch(setDiagnostics(current.state, toLintDiagnostics(current.state.doc, diagnostics.items)));
  }, [diagnostics]);

  return (
    <CodeMirror
      value={value}
      onChange={onChange}
      readOnly={readOnly}
      editable={!readOnly}
      autoFocus={autoFocus}
      indentWithTab={false}
      theme={editorTheme}
      extensions={extensions}
      basicSetup={{ foldGutter: false, autocompletion: false, syntaxHighlighting: false, highlightSelectionMatches: false, searchKeymap: true, tabSize: 2 }}
      onCreateEditor={(created) => {
        view.current = created;
        if (diagnostics && diagnostics.text === created.state.doc.toString()) {
          created.dispatch(setDiagnostics(created.state, toLintDiagnostics(created.state.doc, diagnostics.items)));
        }
      }}
      className="overflow-hidden rounded-lg border border-rule"
      data-testid="circuit-editor"
    />
  );
}
