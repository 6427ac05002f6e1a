/** Part lines (R, C, L, U, A), `couple`, and blocks: `block` headers and `use` lines. */
import type { SourceRange } from '../circuit.js';
import type {
  BlockParam,
  BlockStatement,
  ControlledStatement,
  CoupleStatement,
  Ident,
  NodeList,
  OpAmpStatement,
  PartOption,
  PassiveKind,
  PassiveStatement,
  Statement,
  BreakStatement,
  TransformerStatement,
  UseStatement,
  Value,
} from '../ast.js';
import type { Token } from '../lexer.js';
import { didYouMean, suggestionHint } from '../suggest.js';
import {
  CONTROLLED_MODE_WORDS,
  INSTANCE_LETTER,
  NOISE_OFF,
  OPAMP_OPTIONS,
  OPAMP_OPTION_WORDS,
  OPAMP_WORD,
  PART_CLASSES,
  PASSIVES,
  PASSIVE_OPTIONS,
  RETIRED,
  TURNS_WORD,
  BREAK_WORD,
  isDesignator,
} from '../vocabulary.js';
import type { ControlledMode, OpAmpOptionName, PartClassLetter } from '../vocabulary.js';
import { merge, orList, show } from './cursor.js';
import { polesAndZeros, transferExpr } from './transfer.js';
import { replaceWith } from '../diagnostic.js';
import type { Cursor } from './cursor.js';
import { ident, nodeList, value } from './values.js';

export function partStatement(cur: Cursor, letter: PartClassLetter): Statement | null {
  const d = cur.next() as Token;
  const designator: Ident = { name: d.text, range: d.range };
  checkDesignator(cur, d, letter);
  const nodes = nodeList(cur);
  switch (letter) {
    case 'R':
      return passive(cur, 'resistor', designator, nodes);
    case 'C':
      return passive(cur, 'capacitor', designator, nodes);
    case 'L':
      return passive(cur, 'inductor', designator, nodes);
    case 'U':
      return opamp(cur, designator, nodes);
    case 'A':
      return controlled(cur, designator, nodes);
    case 'T':
      return transformer(cur, designator, nodes);
    case 'J':
      return loopBreak(cur, designator, nodes);
  }
}

/**
 * A designator is a reference designator (`R1`, `R4b`, `B2`). A free-form one is the earlier
 * forms: an error whose quick fix writes the next free number of its class. The line is
 * still read under the name as written, so that references to it resolve.
 */
function checkDesignator(cur: Cursor, d: Token, letter: string): void {
  if (isDesignator(d.text, letter)) return;
  const plan = cur.plan();
  const renamed = plan.designator(cur.scope, d.text);
  const what = letter === INSTANCE_LETTER ? 'a block instance’s designator' : 'a designator';
  // The quick fix renames the part where it is defined; say where other lines name it.
  const others = plan.linesOf(d.text).filter((line) => line !== d.range.line);
  const alsoNamed = others.length === 0 ? '' : `; rename it on line${others.length === 1 ? '' : 's'} ${orList(others.map(String), 'and')} too`;
  cur.report(
    d.range,
    'bad-designator',
    `\`${d.text}\` is not a reference designator: ${what} is ${letter}, a number and an optional lower-case suffix, like ${letter}1 or ${letter}4b`,
    `number the part, and say what it does in a comment, like  # ${d.text}${alsoNamed}`,
    renamed === undefined ? undefined : replaceWith(renamed),
  );
}

/** Reports a word of the language's earlier forms, with the quick fix to its new form. */
function retired(cur: Cursor, range: SourceRange, written: string, replacement: string): void {
  cur.report(range, 'retired-word', `\`${written}\` is an earlier form of the language`, `write ${replacement}`, replaceWith(replacement));
}

function checkCount(cur: Cursor, nodes: NodeList, want: number, what: string, example: string): void {
  if (nodes.nodes.length === want) return;
  const has = nodes.nodes.length;
  cur.report(nodes.range, 'node-count', `${what} connects ${want} nodes; this has ${has === 0 ? 'none' : has}`, `write it like ${example}`);
}

/** The earlier spelling of `noise off`. */
const NOISELESS: keyof typeof RETIRED = 'noiseless';
/** Words after which a passive's value has ended. */
const PASSIVE_STOP_WORDS = [...PASSIVE_OPTIONS, NOISELESS];

function passive(cur: Cursor, part: PassiveKind, designator: Ident, nodes: NodeList): PassiveStatement {
  const { letter, unit, example, options: words, optionText } = PASSIVES[part];
  const article = PART_CLASSES[letter].article;
  checkCount(cur, nodes, 2, article, `${designator.name} [a b] ${example}`);
  const v = value(cur, `${designator.name}’s value`, PASSIVE_STOP_WORDS, `${article}’s value is in ${unit}, like ${example}`);
  const options: PartOption[] = [];
  const seen = new Map<string, SourceRange>();
  const note = (kind: string, range: SourceRange) => {
    const before = seen.get(kind);
    if (before !== undefined) {
      cur.report(
        range,
        'duplicate-option',
        kind === 'tolerance' ? `${designator.name} has a tolerance already` : `${designator.name} has ${kind} already`,
        'give each option once',
      );
    }
    seen.set(kind, range);
  };
  const allowed = (t: Token, option: string): boolean => {
    if (words.includes(option)) return true;
    const owner = (Object.keys(PASSIVES) as PassiveKind[]).find((k) => PASSIVES[k].options.includes(option)) ?? 'resistor';
    cur.report(
      t.range,
      'wrong-option',
      `${option} is an option of ${PART_CLASSES[PASSIVES[owner].letter].article}, not of ${article}`,
      `${article} takes ${optionText}`,
    );
    return false;
  };
  while (!cur.atEnd()) {
    const t = cur.peek() as Token;
    if (t.kind === 'punct' && t.punct === '±') {
      cur.next();
      const tol = value(cur, 'the tolerance after ±', [], 'write it like ±1%');
      if (tol === null) continue;
      note('tolerance', merge(t.range, tol.range));
      options.push({ kind: 'tolerance', value: tol, range: merge(t.range, tol.range) });
      continue;
    }
    if (t.kind === 'number' && t.unit === '%') {
      const tol = value(cur, 'the tolerance') as Value;
      note('tolerance', t.range);
      options.push({ kind: 'tolerance', value: tol, range: t.range });
      continue;
    }
    if (t.kind === 'name' && t.text === 'tol') {
      cur.next();
      cur.eat('±');
      const tol = value(cur, 'the tolerance after tol', [], 'write it like tol 1%');
      if (tol === null) continue;
      const range = merge(t.range, tol.range);
      note('tolerance', range);
      options.push({ kind: 'tolerance', value: tol, range });
      continue;
    }
    if (t.kind === 'name' && (t.text === 'noise' || t.text === NOISELESS)) {
      cur.next();
      let range = t.range;
      if (t.text === NOISELESS) {
        retired(cur, t.range, t.text, RETIRED.noiseless);
      } else {
        const off = cur.peek();
        if (off === undefined || off.kind !== 'name' || off.text !== NOISE_OFF) {
          cur.report(off?.range ?? t.range, 'bad-option', 'noise takes the word off', `a resistor without thermal noise is written noise ${NOISE_OFF}`);
          if (off !== undefined && off.kind === 'name') cur.next();
          continue;
        }
        cur.next();
        range = merge(t.range, off.range);
      }
      if (allowed(t, 'noise')) {
        note('noise off', range);
        options.push({ kind: 'noise-off', range });
      }
      continue;
    }
    if (t.kind === 'name' && (t.text === 'esr' || t.text === 'esl' || t.text === 'dcr')) {
      cur.next();
      const ok = allowed(t, t.text);
      const amount = value(
        cur,
        `the value after ${t.text}`,
        PASSIVE_STOP_WORDS,
        t.text === 'esl' ? 'esl is in H, like esl 1n' : `${t.text} is in Ω, like ${t.text} 20m`,
      );
      if (amount === null || !ok) continue;
      const kind = t.text;
      const range = merge(t.range, amount.range);
      note(kind, range);
      options.push({ kind, value: amount, range });
      continue;
    }
    unknownOption(cur, t, designator.name, words, optionText, article);
  }
  return { kind: 'passive', part, designator, nodes, value: v, options, range: cur.whole() };
}

function unknownOption(cur: Cursor, t: Token, designator: string, words: readonly string[], list: string, article: string): never {
  if (t.kind === 'number' || (t.kind === 'punct' && t.punct === '(')) {
    cur.error(
      t.range,
      'unexpected-token',
      `\`${show(t)}\` is one value too many: ${designator} has its value already`,
      `a tolerance is written ±5% or 5%; ${article} takes ${list}`,
    );
  }
  if (t.kind === 'name') {
    const near = didYouMean(t.text, words);
    cur.error(t.range, 'unknown-option', `\`${t.text}\` is not an option of ${designator}`, suggestionHint(near, `${article} takes ${list}`), near.fix);
  }
  return cur.error(t.range, 'unexpected-token', `unexpected \`${show(t)}\` in ${designator}`, `${article} takes ${list}`);
}

const OPAMP_OPTION_LIST = OPAMP_OPTION_WORDS.join(', ');
const RETIRED_OPAMP_OPTIONS: Readonly<Record<string, OpAmpOptionName>> = { en: RETIRED.en, in: RETIRED.in };

function opamp(cur: Cursor, designator: Ident, nodes: NodeList): OpAmpStatement {
  checkCount(cur, nodes, 3, 'an op-amp', `${designator.name} [p n out] opamp (non-inverting, inverting, output)`);
  const word = cur.peek();
  if (word === undefined || word.kind !== 'name' || word.text !== OPAMP_WORD) {
    const hint = `write ${designator.name} [p n out] opamp, then any of ${OPAMP_OPTION_LIST}`;
    if (word !== undefined && word.kind === 'name') {
      const near = didYouMean(word.text, [OPAMP_WORD]);
      if (near.fix !== undefined) cur.error(word.range, 'missing-opamp', `\`${word.text}\` should be opamp`, hint, near.fix);
      cur.error(word.range, 'missing-opamp', `\`${word.text}\` is not a kind of U part: a U part is an opamp, described by its options`, hint);
    }
    cur.error(word?.range ?? nodes.range, 'missing-opamp', `${designator.name} needs the word opamp after its nodes`, hint);
  }
  cur.next();
  const options: OpAmpStatement['options'] = [];
  while (!cur.atEnd()) {
    const t = cur.peek() as Token;
    const name =
      t.kind === 'name' ? ((OPAMP_OPTION_WORDS as string[]).includes(t.text) ? (t.text as OpAmpOptionName) : RETIRED_OPAMP_OPTIONS[t.text]) : undefined;
    if (name !== undefined) {
      cur.next();
      if (name !== t.text) retired(cur, t.range, t.text, name);
      const amount = value(cur, `the value after ${t.text}`, OPAMP_OPTION_WORDS, `${name} is in ${OPAMP_OPTIONS[name]}`);
      if (amount === null) continue;
      const range = merge(t.range, amount.range);
      if (options.some((o) => o.name === name)) cur.report(range, 'duplicate-option', `${designator.name} has ${name} already`, 'give each option once');
      else options.push({ name, value: amount, range });
      continue;
    }
    unknownOption(cur, t, designator.name, OPAMP_OPTION_WORDS, OPAMP_OPTION_LIST, 'an op-amp');
  }
  return { kind: 'opamp', designator, nodes, options, range: cur.whole() };
}

function controlled(cur: Cursor, designator: Ident, nodes: NodeList): ControlledStatement | null {
  const word = cur.peek();
  const hint =
    'an A part is one of: A1 [o+ o- c+ c-] vgain K, A1 [o+ o- c+ c-] gm S, A1 [o+ o-] igain K of R1, A1 [o+ o-] rm Ω of R1, A1 [o+ o- c+ c-] transfer H(s), A1 [o+ o- c+ c-] poles F, …';
  if (word === undefined || word.kind !== 'name' || !(CONTROLLED_MODE_WORDS as string[]).includes(word.text)) {
    if (word !== undefined && word.kind === 'name') {
      const near = didYouMean(word.text, CONTROLLED_MODE_WORDS);
      cur.error(word.range, 'missing-mode', `\`${word.text}\` is not a kind of controlled source`, suggestionHint(near, hint), near.fix);
    }
    cur.error(word?.range ?? nodes.range, 'missing-mode', `${designator.name} needs ${orList(CONTROLLED_MODE_WORDS)} after its nodes`, hint);
  }
  cur.next();
  const mode = word.text as ControlledMode;
  if (mode === 'transfer' || mode === 'poles') {
    checkCount(cur, nodes, 4, `a transfer-function source (${mode})`, `${designator.name} [o+ o- c+ c-] ${mode} …`);
    const response = mode === 'transfer' ? transferExpr(cur, designator.name) : polesAndZeros(cur, designator.name);
    return { kind: 'controlled', designator, nodes, mode, value: null, control: null, response, range: cur.whole() };
  }
  const fourNode = mode === 'vgain' || mode === 'gm';
  checkCount(
    cur,
    nodes,
    fourNode ? 4 : 2,
    fourNode ? `a voltage-controlled source (${mode})` : `a current-controlled source (${mode})`,
    fourNode
      ? `${designator.name} [o+ o- c+ c-] ${mode} ${mode === 'gm' ? '1m' : '10'}`
      : `${designator.name} [o+ o-] ${mode} ${mode === 'rm' ? '1k' : '10'} of R1`,
  );
  const what = { vgain: 'the gain after vgain', gm: 'the transconductance after gm', igain: 'the gain after igain', rm: 'the transresistance after rm' }[mode];
  const v = value(cur, what, ['of'], { vgain: 'vgain is in V/V or dB', gm: 'gm is in S', igain: 'igain is in A/A or dB', rm: 'rm is in Ω' }[mode]);
  let control: Ident | null = null;
  if (!fourNode) {
    if (cur.eat('of') === undefined) {
      cur.report(
        cur.here(),
        'missing-control',
        `${mode} needs the part whose current controls it`,
        `write ${designator.name} [o+ o-] ${mode} ${mode === 'rm' ? '1k' : '10'} of R1`,
      );
    } else {
      control = ident(cur, 'the controlling part after of', `${mode} 10 of R1`);
    }
  }
  cur.finish(`${designator.name}`, hint);
  return { kind: 'controlled', designator, nodes, mode, value: v, control, range: cur.whole() };
}

/** `T1 [p+ p- s+ s-] turns N`. */
function transformer(cur: Cursor, designator: Ident, nodes: NodeList): TransformerStatement {
  const hint = `write ${designator.name} [p+ p- s+ s-] ${TURNS_WORD} 2: N secondary turns per primary turn, the dotted ends first`;
  checkCount(cur, nodes, 4, 'a transformer', `${designator.name} [p+ p- s+ s-] ${TURNS_WORD} 2 (primary, then secondary)`);
  const word = cur.peek();
  if (word === undefined || word.kind !== 'name' || word.text !== TURNS_WORD) {
    const near = word !== undefined && word.kind === 'name' ? didYouMean(word.text, [TURNS_WORD]) : undefined;
    cur.error(word?.range ?? nodes.range, 'missing-turns', `${designator.name} needs its turns ratio after its nodes`, hint, near?.fix);
  }
  cur.next();
  const turns = value(cur, 'the turns ratio after turns', [], hint);
  cur.finish(`the turns ratio`, hint);
  return { kind: 'transformer', designator, nodes, turns, range: cur.whole() };
}

/** `J1 [from to] break`. */
function loopBreak(cur: Cursor, designator: Ident, nodes: NodeList): BreakStatement {
  const hint = `write ${designator.name} [from to] ${BREAK_WORD}, in the wire that carries the loop’s signal from one node to the next`;
  checkCount(cur, nodes, 2, 'a loop break', `${designator.name} [out n] ${BREAK_WORD}`);
  const word = cur.peek();
  if (word === undefined || word.kind !== 'name' || word.text !== BREAK_WORD) {
    const near = word !== undefined && word.kind === 'name' ? didYouMean(word.text, [BREAK_WORD]) : undefined;
    cur.error(word?.range ?? nodes.range, 'missing-break', `${designator.name} needs the word ${BREAK_WORD} after its nodes`, hint, near?.fix);
  }
  cur.next();
  cur.finish(BREAK_WORD, hint);
  return { kind: 'break', designator, nodes, range: cur.whole() };
}

export function coupleStatement(cur: Cursor): CoupleStatement {
  const keyword = cur.next() as Token;
  const l1 = ident(cur, 'the first inductor', 'couple L1 L2 0.99');
  const l2 = ident(cur, 'the second inductor', 'couple L1 L2 0.99');
  const k = value(cur, 'the coupling factor', [], 'write couple L1 L2 K, with 0 < K ≤ 1');
  cur.finish('the coupling factor', 'write couple L1 L2 K');
  return { kind: 'couple', l1, l2, k, range: merge(keyword.range, cur.whole()) };
}

export function blockHeader(cur: Cursor): BlockStatement {
  const keyword = cur.next() as Token;
  const name = ident(cur, 'the block’s name', 'block lowpass [in out] (R, C = 10n)');
  if (!cur.isPunct('[')) {
    cur.error(cur.here(), 'missing-nodes', `block ${name.name} needs its pins in brackets`, `write block ${name.name} [in out]`);
  }
  const pins = nodeList(cur);
  const params: BlockParam[] = [];
  if (cur.isPunct('(')) {
    const open = cur.next() as Token;
    while (!cur.atEnd() && !cur.isPunct(')')) {
      const p = ident(cur, 'a parameter name', '(R, C = 10n)');
      let def: Value | null = null;
      if (cur.eat('=') !== undefined) def = listValue(cur, `the default of ${p.name}`, p.name);
      params.push({ name: p, default: def });
      if (cur.isPunct(')')) break;
      if (cur.eat(',') === undefined)
        cur.error(cur.here(), 'unexpected-token', `expected \`,\` or \`)\` after ${p.name}`, 'parameters are separated by commas: (R, C = 10n)');
    }
    if (cur.eat(')') === undefined) cur.error(open.range, 'unclosed-parenthesis', 'this `(` is never closed', 'the parameter list ends with `)`');
  }
  cur.finish(`block ${name.name}`, 'a block line is block NAME [pins] (parameters)');
  return { kind: 'block', name, pins, params, body: [], range: merge(keyword.range, cur.whole()), endRange: null };
}

export function useStatement(cur: Cursor): UseStatement {
  const keyword = cur.next() as Token;
  const block = ident(cur, 'the block’s name', 'use lowpass as B1 [in out]');
  cur.expect('as', 'missing-as', `\`as\` is missing after use ${block.name}`, `write use ${block.name} as B1 [nodes]`);
  const instanceToken = cur.peek();
  const instance = ident(cur, 'the instance’s designator', `use ${block.name} as B1 [in out]`);
  checkDesignator(cur, instanceToken as Token, INSTANCE_LETTER);
  if (!cur.isPunct('['))
    cur.error(cur.here(), 'missing-nodes', `${instance.name} needs its nodes in brackets`, `write use ${block.name} as ${instance.name} [in out]`);
  const nodes = nodeList(cur);
  const args: UseStatement['args'] = [];
  if (cur.isPunct('(')) {
    const open = cur.next() as Token;
    while (!cur.atEnd() && !cur.isPunct(')')) {
      const p = ident(cur, 'a parameter name', '(R = 10k)');
      cur.expect('=', 'missing-equals', `\`=\` is missing after ${p.name}`, `write (${p.name} = VALUE)`);
      const v = listValue(cur, `the value of ${p.name}`, p.name);
      args.push({ name: p, value: v });
      if (cur.isPunct(')')) break;
      if (cur.eat(',') === undefined)
        cur.error(cur.here(), 'unexpected-token', `expected \`,\` or \`)\` after the value of ${p.name}`, 'values are separated by commas: (R = 10k, C = 1n)');
    }
    if (cur.eat(')') === undefined) cur.error(open.range, 'unclosed-parenthesis', 'this `(` is never closed', 'the list of values ends with `)`');
  }
  cur.finish(instance.name, `write use ${block.name} as ${instance.name} [nodes] (NAME = VALUE, …)`);
  return { kind: 'use', block, instance, nodes, args, range: merge(keyword.range, cur.whole()) };
}

const OPERATORS: readonly string[] = ['+', '-', '*', '/', '^'];

/**
 * A value in a parameter list, `(R = 10k)`. An expression there needs parentheses, because
 * the commas and the closing `)` of the list end it; only a `let` line takes one without.
 * The quick fix adds them around the expression as far as the next `,` or `)` of the list.
 */
function listValue(cur: Cursor, what: string, name: string): Value | null {
  const v = value(cur, what);
  const op = cur.peek();
  if (v === null || op === undefined || op.kind !== 'punct' || !OPERATORS.includes(op.text)) return v;
  let depth = 0;
  const first = cur.tokens.findIndex((t) => t.range.column === v.range.column);
  let last = cur.tokens[cur.pos - 1];
  while (!cur.atEnd()) {
    const t = cur.peek() as Token;
    if (depth === 0 && t.kind === 'punct' && (t.punct === ',' || t.punct === ')')) break;
    if (t.kind === 'punct' && t.punct === '(') depth++;
    if (t.kind === 'punct' && t.punct === ')') depth--;
    last = cur.next() as Token;
  }
  const range = merge(v.range, last.range);
  const text = cur.line.text.slice(range.column - 1, range.endColumn - 1);
  cur.report(
    range,
    'unparenthesised-expression',
    `\`${text}\` is an expression: in a parameter list it needs parentheses`,
    `write ${name} = (${text}); a let line is the one place an expression goes without them`,
    { title: `Write (${text})`, replacement: `(${text})`, range },
  );
  // Read as the expression it is, so that the lines that use the value say nothing more.
  return { kind: 'expr', tokens: cur.tokens.slice(first, cur.pos), text, range };
}
