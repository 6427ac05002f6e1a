/**
 * Expressions in values: `(2*Cb)`, `let f0 = 1/(2*pi*R*C)`. mathjs reads the structure
 * (precedence, parentheses, calls); we hand it placeholders for every number and name, so
 * SI prefixes, IEC forms and dotted names never reach it, then evaluate its tree ourselves
 * over a short list of operators and functions. Nothing else of mathjs is reachable: no
 * assignment, no function definitions, no matrices, no mathjs units. Units written on
 * numbers are carried along so that a value's unit can be checked where it is used.
 */
import { create, parseDependencies } from 'mathjs';
import type { MathNode } from 'mathjs';
import type { SourceRange } from './circuit.js';
import type { Diagnostic } from './result.js';
import { lex, separateUnit } from './lexer.js';
import type { Token } from './lexer.js';
import type { Unit } from './units.js';
import { diagnostic } from './diagnostic.js';
import { didYouMean, suggest } from './suggest.js';

const math = create({ parseDependencies });

/** A value's unit: known, none (a plain number), or a product the language does not track. */
export type ExprUnit = Unit | null | 'compound';

export interface Quantity {
  value: number;
  unit: ExprUnit;
}

/** Looks a name up: its value, or the diagnostic that says why it has none. */
export type Resolve = (name: string, range: SourceRange) => Quantity | Diagnostic;

export const FUNCTIONS: Readonly<Record<string, { arity: number | 'many'; apply: (args: number[]) => number }>> = {
  sqrt: { arity: 1, apply: ([x]) => Math.sqrt(x) },
  exp: { arity: 1, apply: ([x]) => Math.exp(x) },
  ln: { arity: 1, apply: ([x]) => Math.log(x) },
  log10: { arity: 1, apply: ([x]) => Math.log10(x) },
  sin: { arity: 1, apply: ([x]) => Math.sin(x) },
  cos: { arity: 1, apply: ([x]) => Math.cos(x) },
  tan: { arity: 1, apply: ([x]) => Math.tan(x) },
  atan: { arity: 1, apply: ([x]) => Math.atan(x) },
  abs: { arity: 1, apply: ([x]) => Math.abs(x) },
  min: { arity: 'many', apply: (xs) => Math.min(...xs) },
  max: { arity: 'many', apply: (xs) => Math.max(...xs) },
};

export const CONSTANTS: Readonly<Record<string, number>> = { pi: Math.PI, e: Math.E };

const FUNCTION_LIST = Object.keys(FUNCTIONS).join(', ');

export type Evaluation = { ok: true; quantity: Quantity } | { ok: false; diagnostics: Diagnostic[] };

interface Piece {
  text: string;
  token: Token;
}

/**
 * Evaluates an expression's tokens. `range` is the whole expression's (for problems that
 * belong to no one token). Never throws.
 */
export function evaluateTokens(tokens: readonly Token[], range: SourceRange, resolve: Resolve): Evaluation {
  try {
    return evaluateUnsafe(tokens, range, resolve);
  } catch (e) {
    const why = e instanceof Error ? e.message : String(e);
    return { ok: false, diagnostics: [diagnostic(range, 'bad-expression', `this expression cannot be evaluated (${why})`)] };
  }
}

function evaluateUnsafe(tokens: readonly Token[], range: SourceRange, resolve: Resolve): Evaluation {
  const errors: Diagnostic[] = [];
  const fail = (d: Diagnostic): Evaluation => ({ ok: false, diagnostics: [...errors, d] });
  if (tokens.length === 0) return fail(diagnostic(range, 'bad-expression', 'the parentheses hold nothing', { hint: 'write an expression inside them, like (2*Cb)' }));
  const pieces: Piece[] = [];
  const values = new Map<string, Quantity>();
  const functionTokens = new Map<string, Token>();
  // Which open parentheses belong to a function call (commas are allowed only there).
  const parens: boolean[] = [];
  let previous: 'operand' | 'operator' | 'start' = 'start';

  for (let i = 0; i < tokens.length; i++) {
    const t = tokens[i];
    const next = tokens[i + 1];
    const startsOperand = t.kind === 'number' || t.kind === 'name' || (t.kind === 'punct' && t.punct === '(');
    const apart = previous === 'operand' && tokens[i - 1]?.kind === 'number' && !(next?.kind === 'punct' && next.punct === '(') ? separateUnit(t) : null;
    if (apart !== null) {
      const key = pieces[pieces.length - 1].text;
      const q = values.get(key);
      const before = tokens[i - 1];
      if (q !== undefined && q.unit === null && !(apart.prefixed && before.prefixed === true)) {
        q.value *= apart.multiplier;
        q.unit = apart.unit;
        continue;
      }
      return fail(diagnostic(t.range, 'bad-expression', q?.unit === null ? `\`${before.text}\` has an SI prefix already; \`${t.text}\` would add a second` : `\`${before.text}\` already has a unit; \`${t.text}\` is one too many`));
    }
    if (startsOperand && previous === 'operand') {
      return fail(
        diagnostic(t.range, 'bad-expression', `two values side by side: \`${tokens[i - 1].text}\` and \`${t.text}\``, {
          hint: 'put an operator between them, such as * for a product',
        }),
      );
    }
    if (t.kind === 'number') {
      if (t.bad) return { ok: false, diagnostics: errors };
      const key = `_n${i}`;
      values.set(key, { value: t.value ?? NaN, unit: t.unit ?? null });
      pieces.push({ text: key, token: t });
      previous = 'operand';
      continue;
    }
    if (t.kind === 'name') {
      const call = next?.kind === 'punct' && next.punct === '(';
      if (call) {
        if (FUNCTIONS[t.text] === undefined) {
          const near = suggest(t.text, Object.keys(FUNCTIONS));
          return fail(
            diagnostic(t.range, 'unknown-function', `\`${t.text}\` is not a function the language knows`, {
              hint: near.length > 0 ? `${didYouMean(near)} The functions are ${FUNCTION_LIST}.` : `the functions are ${FUNCTION_LIST}`,
              fix: near.length === 1 ? { title: `Replace with ${near[0]}`, replacement: near[0] } : undefined,
            }),
          );
        }
        functionTokens.set(t.text, functionTokens.get(t.text) ?? t);
        pieces.push({ text: t.text, token: t });
        pieces.push({ text: '(', token: next });
        parens.push(true);
        i++;
        previous = 'operator';
        continue;
      }
      if (FUNCTIONS[t.text] !== undefined) {
        return fail(diagnostic(t.range, 'bad-expression', `${t.text} is a function: write ${t.text}(x)`));
      }
      const key = `_v${i}`;
      const constant = CONSTANTS[t.text];
      if (constant !== undefined) {
        values.set(key, { value: constant, unit: null });
      } else {
        const found = resolve(t.text, t.range);
        if ('code' in found) {
          errors.push(found);
          values.set(key, { value: NaN, unit: null });
        } else {
          values.set(key, { ...found });
        }
      }
      pieces.push({ text: key, token: t });
      previous = 'operand';
      continue;
    }
    if (t.kind === 'punct') {
      switch (t.punct) {
        case '+':
        case '-':
        case '*':
        case '/':
        case '^':
          pieces.push({ text: t.punct, token: t });
          previous = 'operator';
          continue;
        case '(':
          parens.push(false);
          pieces.push({ text: '(', token: t });
          previous = 'operator';
          continue;
        case ')':
          parens.pop();
          pieces.push({ text: ')', token: t });
          previous = 'operand';
          continue;
        case ',':
          if (parens.length === 0 || !parens[parens.length - 1]) {
            return fail(diagnostic(t.range, 'bad-expression', 'a comma only separates the arguments of a function, as in min(a, b)'));
          }
          pieces.push({ text: ',', token: t });
          previous = 'operator';
          continue;
        default:
          return fail(diagnostic(t.range, 'bad-expression', `\`${t.text}\` cannot appear in an expression`, { hint: 'expressions use + - * / ^, parentheses, numbers, parameter names and functions' }));
      }
    }
    if (t.kind === 'error') return { ok: false, diagnostics: errors };
    return fail(diagnostic(t.range, 'bad-expression', `\`${t.text}\` cannot appear in an expression`, { hint: 'expressions use + - * / ^, parentheses, numbers, parameter names and functions' }));
  }
  if (errors.length > 0) return { ok: false, diagnostics: errors };

  const starts: number[] = [];
  let source = '';
  for (const p of pieces) {
    starts.push(source.length);
    source += p.text + ' ';
  }
  let tree: MathNode;
  try {
    tree = math.parse(source);
  } catch (e) {
    const at = typeof (e as { char?: unknown }).char === 'number' ? ((e as { char: number }).char as number) : -1;
    let where = range;
    if (at >= 0) {
      let k = 0;
      while (k + 1 < starts.length && starts[k + 1] <= at) k++;
      where = at >= source.trimEnd().length ? pieces[pieces.length - 1].token.range : pieces[k].token.range;
    }
    return fail(diagnostic(where, 'bad-expression', syntaxMessage(e instanceof Error ? e.message : String(e)), { hint: 'expressions use + - * / ^, parentheses, numbers, parameter names and functions' }));
  }
  const walked = walk(tree, values, functionTokens, range);
  if ('code' in walked) return fail(walked);
  if (Number.isNaN(walked.value)) {
    return fail(diagnostic(range, 'bad-expression', 'this expression has no value (a square root or logarithm of a negative number?)'));
  }
  if (!Number.isFinite(walked.value)) {
    return fail(diagnostic(range, 'bad-expression', 'this expression is infinite (a division by zero?)'));
  }
  return { ok: true, quantity: walked };
}

function syntaxMessage(raw: string): string {
  if (raw.startsWith('Unexpected end of expression')) return 'this expression ends too early: a value is missing';
  if (raw.startsWith('Parenthesis ) expected')) return 'a `(` in this expression is never closed';
  if (raw.startsWith('Value expected')) return 'a value is missing here';
  if (raw.startsWith('Unexpected operator')) return 'an operator stands where a value should';
  if (raw.startsWith('Unexpected type of argument') || raw.startsWith('Unexpected')) return 'this expression cannot be read here';
  return 'this expression cannot be read';
}

function describeUnit(u: ExprUnit): string {
  return u === null ? 'a plain number' : u === 'compound' ? 'a product of units' : u;
}

/** Evaluates mathjs's tree over the allowed operators and functions only. */
function walk(node: MathNode, values: Map<string, Quantity>, functions: Map<string, Token>, range: SourceRange): Quantity | Diagnostic {
  const notAllowed = () => diagnostic(range, 'bad-expression', 'this expression uses something the language does not allow', { hint: `expressions use + - * / ^, parentheses, numbers, parameter names and the functions ${FUNCTION_LIST}` });
  const n = node as MathNode & Record<string, unknown>;
  switch (node.type) {
    case 'SymbolNode': {
      const q = values.get(n.name as string);
      return q === undefined ? notAllowed() : q;
    }
    case 'ConstantNode':
      return typeof n.value === 'number' ? { value: n.value, unit: null } : notAllowed();
    case 'ParenthesisNode':
      return walk(n.content as MathNode, values, functions, range);
    case 'OperatorNode': {
      if (n.implicit === true) return notAllowed();
      const args = (n.args as MathNode[]).map((a) => walk(a, values, functions, range));
      for (const a of args) if ('code' in a) return a;
      const [a, b] = args as Quantity[];
      switch (n.fn) {
        case 'unaryMinus':
          return { value: -a.value, unit: a.unit };
        case 'unaryPlus':
          return a;
        case 'add':
        case 'subtract': {
          const unit = sameUnit(a.unit, b.unit);
          if (unit === undefined) {
            return diagnostic(range, 'unit-mismatch', `cannot ${n.fn === 'add' ? 'add' : 'subtract'} ${describeUnit(a.unit)} and ${describeUnit(b.unit)}`);
          }
          return { value: n.fn === 'add' ? a.value + b.value : a.value - b.value, unit };
        }
        case 'multiply':
          return { value: a.value * b.value, unit: a.unit === null ? b.unit : b.unit === null ? a.unit : 'compound' };
        case 'divide': {
          const unit = b.unit === null ? a.unit : a.unit !== null && a.unit === b.unit && a.unit !== 'compound' ? null : 'compound';
          return { value: a.value / b.value, unit };
        }
        case 'pow':
          return { value: a.value ** b.value, unit: a.unit === null ? null : 'compound' };
        default:
          return notAllowed();
      }
    }
    case 'FunctionNode': {
      const fnNode = n.fn as MathNode & { name?: string };
      const name = fnNode.type === 'SymbolNode' ? fnNode.name : undefined;
      const fn = name === undefined ? undefined : FUNCTIONS[name];
      if (fn === undefined || name === undefined) return notAllowed();
      const where = functions.get(name)?.range ?? range;
      const argNodes = n.args as MathNode[];
      if (fn.arity === 1 && argNodes.length !== 1) {
        return diagnostic(where, 'bad-expression', `${name} takes one value; this gives it ${argNodes.length === 0 ? 'none' : argNodes.length}`);
      }
      if (fn.arity === 'many' && argNodes.length === 0) return diagnostic(where, 'bad-expression', `${name} needs at least one value`);
      const args = argNodes.map((a) => walk(a, values, functions, range));
      for (const a of args) if ('code' in a) return a;
      const qs = args as Quantity[];
      const value = fn.apply(qs.map((q) => q.value));
      if (name === 'abs' || name === 'min' || name === 'max') {
        let unit: ExprUnit | undefined = qs[0].unit;
        for (const q of qs.slice(1)) unit = unit === undefined ? undefined : sameUnit(unit, q.unit);
        if (unit === undefined) return diagnostic(where, 'unit-mismatch', `${name} compares values in different units`);
        return { value, unit };
      }
      return { value, unit: name === 'sqrt' && qs[0].unit !== null ? 'compound' : null };
    }
    default:
      return notAllowed();
  }
}

/** The unit of a sum: the same on both sides, or taken from the side that has one. */
function sameUnit(a: ExprUnit, b: ExprUnit): ExprUnit | undefined {
  if (a === null) return b;
  if (b === null) return a;
  if (a === 'compound' || b === 'compound') return 'compound';
  return a === b ? a : undefined;
}

/**
 * Evaluates an expression written as text, for tools and tests: `evaluateExpression('2*pi*1k')`.
 * Names are looked up in `params`. Returns the value, or the first problem in plain words.
 */
export function evaluateExpression(text: string, params: Readonly<Record<string, number>> = {}): { value: number; unit: ExprUnit } | { error: string } {
  try {
    const lexed = lex(text);
    if (lexed.diagnostics.length > 0) return { error: lexed.diagnostics[0].message };
    const tokens = lexed.lines.flatMap((l) => l.tokens);
    const range: SourceRange = { line: 1, column: 1, endColumn: Math.max(1, text.length) + 1 };
    const result = evaluateTokens(tokens, range, (name, r) =>
      Object.prototype.hasOwnProperty.call(params, name)
        ? { value: params[name], unit: null }
        : diagnostic(r, 'undefined-name', `there is no parameter named \`${name}\``),
    );
    if (result.ok) return { value: result.quantity.value, unit: result.quantity.unit };
    return { error: result.diagnostics[0]?.message ?? 'this expression cannot be read' };
  } catch (e) {
    return { error: e instanceof Error ? e.message : String(e) };
  }
}
