/**
 * Completion for circuit cells: statement words and part kinds at a line start, node names
 * inside brackets, designators where a part is named, and the parameters, measures and
 * options that fit where the cursor stands. Names come from the cell itself.
 */
import type { Completion, CompletionContext, CompletionResult } from '@codemirror/autocomplete';
import { CONNECTIVES, GROUND, NOISE_OFF, PART_LETTERS, PART_WORDS, PASSIVES, SHOW_MODES, TRACE_WORDS } from '@rolloff/solver';
import type { PartClassLetter } from '@rolloff/solver';
import { tokenizeCell, tokenizeCellLine } from './cell-language';
import { functionWords, measureWords, partKindWords, partLetters, statementInfo, statementWords } from './cell-words';

/** The names a cell defines, found with the same tokenizer that colours it. */
export interface CellNames {
  nodes: string[];
  designators: string[];
  parameters: string[];
  blocks: string[];
}

const sorted = (set: Set<string>) => [...set].sort((a, b) => a.localeCompare(b, 'en', { numeric: true }));

/** Collects node names, designators, parameters and block names written in `text`. */
export function collectCellNames(text: string): CellNames {
  const nodes = new Set<string>([GROUND]);
  const designators = new Set<string>();
  const parameters = new Set<string>();
  const blocks = new Set<string>();
  for (const token of tokenizeCell(text)) {
    if (token.style === 'variableName.special') nodes.add(token.text);
    else if (token.style === 'labelName') designators.add(token.text);
    else if (token.style === 'variableName.definition') parameters.add(token.text);
    else if (token.style === 'typeName' && !(partKindWords as readonly string[]).includes(token.text)) blocks.add(token.text);
  }
  return { nodes: sorted(nodes), designators: sorted(designators), parameters: sorted(parameters), blocks: sorted(blocks) };
}

const option = (label: string, type: string, detail?: string, boost?: number): Completion => ({ label, type, detail, boost });

/**
 * What fits at the end of `lineBefore` (the line's text up to the cursor, without the word
 * being typed) in a cell that defines `names`.
 */
export function completionsFor(lineBefore: string, names: CellNames): Completion[] {
  const { tokens, state } = tokenizeCellLine(lineBefore);
  const nodes = names.nodes.map((n) => option(n, 'variable', 'node', 2));
  const designators = names.designators.map((d) => option(d, 'class', 'part'));
  const parameters = names.parameters.map((p) => option(p, 'constant', 'parameter', 1));
  if (tokens.length === 0) {
    return [
      ...statementWords.map((w) => option(w, 'keyword', statementInfo[w])),
      ...partLetters.map((p) => ({ ...option(p.letter, 'type', p.kind), info: `${p.letter}1 ${p.template}` })),
    ];
  }
  if (tokens.some((t) => t.style === 'comment')) return [];
  if (state.inBracket) return nodes;
  const last = tokens[tokens.length - 1];
  const words = tokens.filter((t) => t.style !== 'operator' && t.style !== 'punctuation');
  const previous = words[words.length - 1]?.text;
  if (previous === 'of' || previous === 'current' || previous === 'as') return designators;
  const values = [...parameters, ...functionWords.map((f) => option(f, 'function', 'function'))];
  switch (state.head) {
    case 'part': {
      const letter = tokens[0].text[0];
      const closedBracket = tokens.some((t) => t.text === ']');
      if (!closedBracket) return [];
      if (previous === 'noise') return [option(NOISE_OFF, 'keyword', 'no thermal noise')];
      const words = (PART_LETTERS as readonly string[]).includes(letter) ? PART_WORDS[letter as PartClassLetter] : { kinds: [], options: [] };
      const [kinds, optionWords] = [words.kinds, words.options];
      return [...kinds.map((k) => option(k, 'type', 'part kind', 3)), ...values, ...optionWords.map((w) => option(w, 'keyword', 'option'))];
    }
    case 'couple':
      return designators.filter((d) => d.label.startsWith(PASSIVES.inductor.letter));
    case 'drive':
      return [...CONNECTIVES.drive.map((w) => option(w, 'keyword')), ...nodes, ...parameters];
    case 'show':
      return [...[...SHOW_MODES, ...TRACE_WORDS].map((w) => option(w, 'keyword', 'trace kind')), ...nodes];
    case 'require':
      if (!state.measureSeen) {
        const hasTarget = tokens.length > 1;
        return hasTarget ? measureWords.map((m) => option(m, 'property', 'measure', 3)) : [option('impedance', 'keyword'), option('loop', 'keyword'), ...nodes];
      }
      return last.style === 'number' || last.style === 'unit' ? CONNECTIVES.require.map((w) => option(w, 'keyword')) : values;
    case 'sweep':
      return [...CONNECTIVES.sweep.map((w) => option(w, 'keyword')), ...parameters];
    case 'spread':
      return [...CONNECTIVES.spread.map((w) => option(w, 'keyword')), ...parameters];
    case 'use':
      return tokens.length === 1 ? names.blocks.map((b) => option(b, 'type', 'block')) : values;
    default:
      return values;
  }
}

/** The CodeMirror completion source for circuit cells. */
export function cellCompletionSource(context: CompletionContext): CompletionResult | null {
  const word = context.matchBefore(/[A-Za-z_][A-Za-z0-9_.-]*/);
  if (!word && !context.explicit) return null;
  const from = word ? word.from : context.pos;
  const line = context.state.doc.lineAt(context.pos);
  const lineBefore = line.text.slice(0, from - line.from);
  // Letters straight after digits are a number's SI prefix or unit (`10n`, `1m`, `4k7`,
  // `1e-9`), not the start of a word: offering words there turns `10n` into `10noise`.
  if (/[0-9.]$/.test(lineBefore)) return null;
  const names = collectCellNames(context.state.doc.toString());
  const options = completionsFor(lineBefore, names);
  if (options.length === 0) return null;
  return { from, options, validFor: /^[A-Za-z0-9_.-]*$/ };
}
