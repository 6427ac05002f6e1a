import { describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { CompletionContext } from '@codemirror/autocomplete';
import { EditorState } from '@codemirror/state';
import { cellCompletionSource, collectCellNames, completionsFor } from './cell-completion';
import { statementWords } from './cell-words';

const names = collectCellNames(FIRST_EXAMPLE);
const labels = (line: string) => completionsFor(line, names).map((c) => c.label);

describe('completion in circuit cells', () => {
  it('finds the nodes, designators and parameters the cell already has', () => {
    expect(names.nodes).toEqual(['a', 'b', 'gnd', 'in', 'out']);
    expect(names.designators).toEqual(['C1', 'C2', 'R1', 'R2', 'U1']);
    expect(names.parameters).toEqual(['Ca', 'Cb', 'R']);
  });

  it('offers statements and part kinds at the start of a line', () => {
    const offered = labels('');
    for (const word of statementWords) expect(offered).toContain(word);
    expect(offered).toEqual(expect.arrayContaining(['R', 'C', 'L', 'U', 'A']));
  });

  it('offers node names inside brackets and nothing else', () => {
    expect(labels('R3 [out ')).toEqual(names.nodes);
  });

  it('offers the kinds a U or A part can be, and the parameters for a value', () => {
    expect(labels('U2 [a b c] ')).toContain('opamp');
    expect(labels('A1 [o gnd c gnd] ')).toEqual(expect.arrayContaining(['vgain', 'gm', 'igain', 'rm']));
    expect(labels('R3 [a b] ')).toEqual(expect.arrayContaining(['R', 'Ca', 'Cb', 'sqrt']));
  });

  it('offers the words of transformers, loop breaks, transfer functions and the op-amp’s second pole, from the vocabulary', () => {
    expect(labels('T1 [p gnd s gnd] ')).toContain('turns');
    expect(labels('J1 [out n] ')).toContain('break');
    expect(labels('A1 [o gnd c gnd] ')).toEqual(expect.arrayContaining(['transfer', 'poles']));
    expect(labels('A1 [o gnd c gnd] poles 1k ')).toEqual(expect.arrayContaining(['zeros', 'q', 'gain']));
    expect(labels('U2 [a b c] opamp gbw 1M ')).toContain('pole2');
  });

  it('offers designators where a part is named', () => {
    expect(labels('A1 [o gnd] igain 2 of ')).toEqual(names.designators);
    expect(labels('show current ')).toEqual(names.designators);
  });

  it('offers measures after the target of a requirement', () => {
    expect(labels('require out ')).toEqual(expect.arrayContaining(['gain', 'corner', 'phase-margin', 'crossover']));
    expect(labels('require out gain >= -3 dB ')).toEqual(['over', 'at']);
  });

  it('offers the words of the new forms: spread, noise off, vnoise and inoise', () => {
    expect(labels('spread 200 ')).toEqual(expect.arrayContaining(['draws', 'seed', 'extremes']));
    expect(labels('R3 [a b] 10k ')).toEqual(expect.arrayContaining(['tol', 'noise']));
    expect(labels('R3 [a b] 10k noise ')).toEqual(['off']);
    expect(labels('U2 [a b c] opamp ')).toEqual(expect.arrayContaining(['vnoise', 'inoise', 'gain', 'gbw', 'zout']));
    expect(labels('U2 [a b c] opamp ')).not.toContain('esr');
    for (const retired of ['tolerance', 'montecarlo', 'worstcase', 'noiseless', 'en', 'in']) {
      expect([...labels(''), ...labels('R3 [a b] 10k '), ...labels('U2 [a b c] opamp ')]).not.toContain(retired);
    }
  });

  it('stays quiet inside comments', () => {
    expect(labels('R1 [a b] 1k  # a comment ')).toEqual([]);
  });
});

describe('the completion source while typing', () => {
  const complete = (doc: string, explicit = false) => cellCompletionSource(new CompletionContext(EditorState.create({ doc }), doc.length, explicit));

  it('offers nothing on the SI prefix or unit of a number, even when asked', () => {
    for (const doc of ['C1 [a gnd] 10n', 'L1 [a b] 1m', 'R1 [in a] 4k7', 'C2 [b out] 2.2uF', 'let C = 1e-9', 'sweep 10 .. 1M']) {
      expect(complete(doc), doc).toBeNull();
      expect(complete(doc, true), doc).toBeNull();
    }
  });

  it('still offers words where a word starts', () => {
    expect(complete('R1 [a b] 10k n')?.options.length).toBeGreaterThan(0);
    expect(complete('sweep 10 .. 1k, 100/d')?.options.map((o) => o.label)).toContain('decade');
    expect(complete('dr')?.options.map((o) => o.label)).toContain('drive');
  });
});
