import { compile, modernizeCellText } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { demoCircuits, demoFork, demoNotebooks } from './demo-notebooks.js';

const everyCircuit = [
  ...Object.entries(demoCircuits),
  ...demoNotebooks.flatMap((notebook) =>
    notebook.cells
      .filter((cell) => cell.kind === 'circuit')
      .flatMap((cell, index) =>
        [cell.text, ...(cell.edits ?? []).map((edit) => edit.text)].map((text) => [`${notebook.key} circuit ${index + 1}`, text] as const),
      ),
  ),
  ['fork edit', demoFork.edit.text] as const,
];

describe('the demo circuits', () => {
  it.each(everyCircuit)('%s compiles without errors', (_name, text) => {
    const errors = compile(text).diagnostics.filter((diagnostic) => diagnostic.severity === 'error');
    expect(errors).toEqual([]);
  });

  it.each(everyCircuit)("%s is written in today's forms already", (_name, text) => {
    expect(modernizeCellText(text)).toEqual({ text, changed: false });
  });

  it('use no parameter named like a keyword, and no model code that could be a real product', () => {
    const all = everyCircuit.map(([, text]) => text).join('\n');
    expect(all).not.toMatch(/^let (gm|gain|gbw|vgain|rm|igain|esr|esl|dcr)\b/m);
    const prose = JSON.stringify(demoNotebooks);
    expect(prose).not.toMatch(/\b[A-Z]{2,}-\d+\b/);
  });
});
