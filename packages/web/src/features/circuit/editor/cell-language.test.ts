import { ensureSyntaxTree } from '@codemirror/language';
import { EditorState } from '@codemirror/state';
import { describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { cellLanguage, tokenizeCell, tokenizeCellLine } from './cell-language';
import type { CellTokenStyle } from './cell-language';

/** The style of the first token with exactly this text on the line. */
function styleOf(line: string, text: string): CellTokenStyle | undefined {
  return tokenizeCellLine(line).tokens.find((t) => t.text === text)?.style;
}

describe('the cell language mode', () => {
  it('tells statement keywords, designators, nodes and parameters apart', () => {
    expect(styleOf('let R  = 10k', 'let')).toBe('keyword');
    expect(styleOf('let R  = 10k', 'R')).toBe('variableName.definition');
    expect(styleOf('R1 [in a]       R      ±1%', 'R1')).toBe('labelName');
    expect(styleOf('R1 [in a]       R      ±1%', 'in')).toBe('variableName.special');
    expect(styleOf('R1 [in a]       R      ±1%', 'a')).toBe('variableName.special');
    expect(styleOf('R1 [in a]       R      ±1%', 'R')).toBe('variableName');
    expect(styleOf('drive in', 'in')).toBe('variableName.special');
    expect(styleOf('show out', 'out')).toBe('variableName.special');
    expect(styleOf('let Ca = 2*Cb', 'Cb')).toBe('variableName');
  });

  it('colours the words of transformers, loop breaks and transfer functions as part kinds and options', () => {
    expect(styleOf('T1 [p gnd s gnd] turns 2', 'turns')).toBe('typeName');
    expect(styleOf('J1 [out n] break', 'break')).toBe('typeName');
    expect(styleOf('A1 [o gnd i gnd] poles 1k q 0.7 zeros 5k gain 2', 'poles')).toBe('typeName');
    expect(styleOf('A1 [o gnd i gnd] poles 1k q 0.7 zeros 5k gain 2', 'zeros')).toBe('modifier');
    expect(styleOf('A1 [o gnd i gnd] poles 1k q 0.7 zeros 5k gain 2', 'q')).toBe('modifier');
    expect(styleOf('U1 [p n o] opamp gbw 1M pole2 5M', 'pole2')).toBe('modifier');
  });

  it('reads numbers with their SI prefix and gives the unit its own colour', () => {
    const tokens = tokenizeCellLine('U1 [b out out]  opamp  gain 100dB  gbw 1M').tokens;
    expect(tokens.map((t) => [t.text, t.style])).toEqual([
      ['U1', 'labelName'],
      ['[', 'squareBracket'],
      ['b', 'variableName.special'],
      ['out', 'variableName.special'],
      ['out', 'variableName.special'],
      [']', 'squareBracket'],
      ['opamp', 'typeName'],
      ['gain', 'modifier'],
      ['100', 'number'],
      ['dB', 'unit'],
      ['gbw', 'modifier'],
      ['1M', 'number'],
    ]);
    expect(
      tokenizeCellLine('C1 [a b] 2n2F')
        .tokens.slice(-2)
        .map((t) => [t.text, t.style]),
    ).toEqual([
      ['2n2', 'number'],
      ['F', 'unit'],
    ]);
    expect(
      tokenizeCellLine('C1 [a b] 10nF')
        .tokens.slice(-2)
        .map((t) => [t.text, t.style]),
    ).toEqual([
      ['10n', 'number'],
      ['F', 'unit'],
    ]);
    expect(tokenizeCellLine('require out gain >= -0.3 dB over 10 .. 500').tokens.find((t) => t.text === 'dB')?.style).toBe('unit');
  });

  it('marks a suffix that is neither prefix nor unit', () => {
    const tokens = tokenizeCellLine('R1 [a b] 10meg').tokens;
    expect(tokens.slice(-2).map((t) => [t.text, t.style])).toEqual([
      ['10', 'number'],
      ['meg', 'invalid'],
    ]);
  });

  it('reads a prefixed unit after a number, and a unit standing apart', () => {
    expect(
      tokenizeCellLine('C1 [a b] 10 nF')
        .tokens.slice(-2)
        .map((t) => [t.text, t.style]),
    ).toEqual([
      ['10', 'number'],
      ['nF', 'unit'],
    ]);
    expect(
      tokenizeCellLine('temperature 25°C')
        .tokens.slice(-2)
        .map((t) => [t.text, t.style]),
    ).toEqual([
      ['25', 'number'],
      ['°C', 'unit'],
    ]);
  });

  it('colours the words of spread, noise off and the op-amp’s noise options', () => {
    expect(tokenizeCellLine('spread 200 draws seed 7').tokens.map((t) => t.style)).toEqual(['keyword', 'number', 'modifier', 'modifier', 'number']);
    expect(styleOf('spread extremes', 'extremes')).toBe('modifier');
    expect(styleOf('R1 [a b] 1k noise off', 'noise')).toBe('modifier');
    expect(styleOf('R1 [a b] 1k noise off', 'off')).toBe('modifier');
    expect(styleOf('U1 [a b c] opamp vnoise 4n inoise 1p', 'vnoise')).toBe('modifier');
    expect(styleOf('U1 [a b c] opamp vnoise 4n inoise 1p', 'inoise')).toBe('modifier');
  });

  it('marks what the lexer cannot read', () => {
    expect(tokenizeCellLine('.ac dec 10 # old').tokens.map((t) => [t.text, t.style])).toEqual([
      ['.ac dec 10', 'invalid'],
      ['# old', 'comment'],
    ]);
    expect(styleOf('R1 [a b] 1k ; R2', ';')).toBe('invalid');
  });

  it('colours comments, labels and requirement measures', () => {
    const line = 'show "low pass" out   # the output';
    expect(styleOf(line, '"low pass"')).toBe('string');
    expect(styleOf(line, '# the output')).toBe('comment');
    expect(styleOf('require loop phase-margin >= 45 deg', 'phase-margin')).toBe('propertyName');
    expect(styleOf('require out corner = 1k ± 2%', 'corner')).toBe('propertyName');
    expect(styleOf('require out corner = 1k ± 2%', 'out')).toBe('variableName.special');
  });

  it('reads digits inside brackets as numbers: a node name starts with a letter', () => {
    const tokens = tokenizeCellLine('R5 [n1 0] 4k7').tokens;
    expect(tokens.map((t) => t.style)).toEqual(['labelName', 'squareBracket', 'variableName.special', 'number', 'squareBracket', 'number']);
  });

  it('knows the designators named after of, current and couple', () => {
    expect(styleOf('A1 [o gnd] igain 2 of R1', 'R1')).toBe('labelName');
    expect(styleOf('show current R2', 'R2')).toBe('labelName');
    expect(styleOf('couple L1 L2 0.98', 'L2')).toBe('labelName');
  });

  it('covers every character of the first example with a token or a space', () => {
    const lines = FIRST_EXAMPLE.split('\n');
    for (const token of tokenizeCell(FIRST_EXAMPLE)) expect(lines[token.line - 1].slice(token.from, token.to)).toBe(token.text);
    const styles = new Set(tokenizeCell(FIRST_EXAMPLE).map((t) => t.style));
    expect(styles.has('invalid')).toBe(false);
    for (const style of ['comment', 'keyword', 'labelName', 'variableName.special', 'variableName.definition', 'number', 'unit', 'typeName', 'propertyName']) {
      expect(styles.has(style as CellTokenStyle)).toBe(true);
    }
  });

  it('gives CodeMirror a syntax tree with the same token kinds', () => {
    const state = EditorState.create({ doc: 'let R = 10k\nR1 [in out] R # series', extensions: [cellLanguage] });
    const tree = ensureSyntaxTree(state, state.doc.length, 5000);
    expect(tree).not.toBeNull();
    const names: string[] = [];
    tree?.iterate({ enter: (node) => void names.push(node.name) });
    expect(names).toEqual(expect.arrayContaining(['keyword', 'variableName.definition', 'number', 'labelName', 'variableName.special', 'comment']));
  });
});
