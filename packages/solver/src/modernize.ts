/**
 * Rewriting a cell written in the language's earlier forms into today's: ground `0` → `gnd`,
 * digits-only nodes → `n12`, free-form designators → the next free number of their class
 * (with every reference to them), `noiseless` → `noise off`, the op-amp's `en`/`in` →
 * `vnoise`/`inoise`, `tolerance montecarlo N` / `tolerance worstcase` → `spread N draws` /
 * `spread extremes`. Only the words that change are touched: comments, spacing, values and
 * line breaks stay as written. The parser's quick fixes propose the same names (`planRenames`).
 */
import { lex, separateUnit } from './lexer.js';
import type { Line, Token } from './lexer.js';
import {
  CONTROLLED_MODE_WORDS,
  INSTANCE_LETTER,
  MEASURE_WORDS,
  OPAMP_OPTION_WORDS,
  OPAMP_WORD,
  PART_LETTERS,
  PASSIVE_OPTIONS,
  RETIRED,
  SHOW_MODES,
  designatorNumber,
  isDesignator,
  isDigitsOnly,
  nodeNameFor,
} from './vocabulary.js';

/** The new names of one cell: designators by scope, digits-only nodes, and block instances. */
export interface RenamePlan {
  /** The new designator of a free-form one, by scope ('' for the top level, else the block's name). */
  designator(scope: string, name: string): string | undefined;
  /** The name that replaces a digits-only node (`0` → `gnd`, `12` → `n12`, or `n12_2` when `n12` is taken). */
  node(digits: string): string;
  /** The block an instance of `scope` places, for names reaching into it (`B1.R3`). */
  blockOf(scope: string, instance: string): string | undefined;
  /** The lines where a name is written, in order. */
  linesOf(name: string): number[];
}

const key = (scope: string, name: string) => `${scope}\u0000${name}`;

function isName(t: Token | undefined, word?: string): t is Token {
  return t !== undefined && t.kind === 'name' && (word === undefined || t.text === word);
}

function isPunct(t: Token | undefined, p: string): boolean {
  return t !== undefined && t.kind === 'punct' && t.punct === p;
}

/** A part's line: a designator of a part class followed by its node list. */
function isPartLine(tokens: readonly Token[]): boolean {
  const first = tokens[0];
  return isName(first) && (PART_LETTERS as string[]).includes(first.text[0]) && isPunct(tokens[1], '[');
}

/** The instance of a `use NAME as INSTANCE …` line. */
function instanceOf(tokens: readonly Token[]): Token | undefined {
  return isName(tokens[0], 'use') && isName(tokens[2], 'as') && isName(tokens[3]) ? tokens[3] : undefined;
}

/** Calls `visit` with each line and the scope it stands in ('' or the enclosing block's name). */
function eachLine(lines: readonly Line[], visit: (line: Line, scope: string) => void): void {
  let scope = '';
  for (const line of lines) {
    const first = line.tokens[0];
    if (first === undefined) continue;
    if (isName(first, 'block')) {
      visit(line, '');
      scope = isName(line.tokens[1]) ? line.tokens[1].text : '';
      continue;
    }
    if (isName(first, 'end')) {
      scope = '';
      continue;
    }
    visit(line, scope);
  }
}

/**
 * Works out a cell's new names. A free-form designator gets the next number after the
 * highest of its class anywhere in the cell, in the order written, skipping any name the
 * cell uses already.
 */
export function planRenames(lines: readonly Line[]): RenamePlan {
  const taken = new Set<string>();
  const highest = new Map<string, number>();
  const written: { scope: string; name: string; letter: string }[] = [];
  const blocks = new Map<string, string>();
  const uses = new Map<string, number[]>();
  eachLine(lines, (line, scope) => {
    for (const t of line.tokens) {
      if (t.kind !== 'name') continue;
      for (const part of t.text.split('.')) taken.add(part);
      const at = uses.get(t.text) ?? [];
      if (at[at.length - 1] !== line.line) at.push(line.line);
      uses.set(t.text, at);
    }
    const tokens = line.tokens;
    const instance = instanceOf(tokens);
    const designator = isPartLine(tokens)
      ? { token: tokens[0], letter: tokens[0].text[0] }
      : instance !== undefined
        ? { token: instance, letter: INSTANCE_LETTER }
        : null;
    if (instance !== undefined) blocks.set(key(scope, instance.text), tokens[1].text);
    if (designator === null) return;
    const name = designator.token.text;
    if (isDesignator(name, designator.letter)) {
      highest.set(designator.letter, Math.max(highest.get(designator.letter) ?? 0, designatorNumber(name) ?? 0));
    } else {
      written.push({ scope, name, letter: designator.letter });
    }
  });
  const designators = new Map<string, string>();
  for (const d of written) {
    if (designators.has(key(d.scope, d.name))) continue;
    let n = (highest.get(d.letter) ?? 0) + 1;
    while (taken.has(`${d.letter}${n}`)) n++;
    highest.set(d.letter, n);
    designators.set(key(d.scope, d.name), `${d.letter}${n}`);
  }
  return {
    designator: (scope, name) => designators.get(key(scope, name)),
    node: (digits) => {
      const base = nodeNameFor(digits);
      if (base === nodeNameFor('0') || !taken.has(base)) return base;
      let k = 2;
      while (taken.has(`${base}_${k}`)) k++;
      return `${base}_${k}`;
    },
    blockOf: (scope, instance) => blocks.get(key(scope, instance)),
    linesOf: (name) => uses.get(name) ?? [],
  };
}

/** One replacement of a line's text; columns are 0-based. */
interface Edit {
  from: number;
  to: number;
  text: string;
}

/** Rewrites a cell's earlier forms into today's; text already in today's forms comes back unchanged. */
export function modernizeCellText(text: string): { text: string; changed: boolean } {
  const source = typeof text === 'string' ? text : String(text);
  const { lines } = lex(source);
  const plan = planRenames(lines);
  const labels = new Set<string>();
  for (const line of lines) if (isName(line.tokens[0], 'show')) for (const t of line.tokens) if (t.kind === 'string') labels.add(t.text.trim());
  const edits = new Map<number, Edit[]>();
  eachLine(lines, (line, scope) => {
    const out: Edit[] = [];
    new LineRewriter(line, scope, plan, labels, out).rewrite();
    if (out.length > 0) edits.set(line.line, out);
  });
  if (edits.size === 0) return { text: source, changed: false };
  // Keep each line break as written.
  const pieces = source.split(/(\r\n|\r|\n)/);
  for (const [lineNumber, lineEdits] of edits) {
    const i = (lineNumber - 1) * 2;
    let lineText = pieces[i];
    for (const e of [...lineEdits].sort((a, b) => b.from - a.from)) lineText = lineText.slice(0, e.from) + e.text + lineText.slice(e.to);
    pieces[i] = lineText;
  }
  const result = pieces.join('');
  return { text: result, changed: result !== source };
}

/** The edits of one line, by the statement it holds. */
class LineRewriter {
  private readonly tokens: readonly Token[];
  constructor(
    private readonly line: Line,
    private readonly scope: string,
    private readonly plan: RenamePlan,
    private readonly labels: ReadonlySet<string>,
    private readonly edits: Edit[],
  ) {
    this.tokens = line.tokens;
  }

  rewrite(): void {
    const first = this.tokens[0];
    if (isPartLine(this.tokens)) return this.part();
    if (!isName(first)) return;
    switch (first.text) {
      case 'block':
        this.nodeList(2);
        return;
      case 'use':
        this.use();
        return;
      case 'couple':
        this.partRef(1);
        this.partRef(2);
        return;
      case 'drive':
        this.drive();
        return;
      case 'show':
        this.show();
        return;
      case 'require':
        this.require();
        return;
      case 'tolerance':
        this.tolerance();
        return;
    }
  }

  private replace(t: Token, text: string): void {
    if (t.text !== text) this.edits.push({ from: t.range.column - 1, to: t.range.endColumn - 1, text });
  }

  /** The node list starting at token `i` (a `[`); returns the index after its `]`. */
  private nodeList(i: number): number {
    if (!isPunct(this.tokens[i], '[')) return i;
    let j = i + 1;
    for (; j < this.tokens.length && !isPunct(this.tokens[j], ']'); j++) this.nodeRef(j);
    return j + 1;
  }

  /** A node: digits become a name; a name reaching into an instance has its pieces renamed. */
  private nodeRef(i: number): void {
    const t = this.tokens[i];
    if (t === undefined) return;
    if (t.kind === 'number' && isDigitsOnly(t.text)) this.replace(t, this.plan.node(t.text));
    else if (t.kind === 'name' && t.text.includes('.'))
      this.replace(
        t,
        this.dotted(t.text, (last) => (isDigitsOnly(last) && last !== '0' ? this.plan.node(last) : last)),
      );
  }

  /** A part named by another line: `of R1`, `couple L1 L2`, `current R1`. */
  private partRef(i: number): void {
    const t = this.tokens[i];
    if (!isName(t)) return;
    if (t.text.includes('.'))
      this.replace(
        t,
        this.dotted(t.text, (last, scope) => this.plan.designator(scope, last) ?? last),
      );
    else this.replace(t, this.plan.designator(this.scope, t.text) ?? t.text);
  }

  /** `B1.B2.x`: each instance renamed in the scope it stands in, then the last piece by `last`. */
  private dotted(name: string, last: (piece: string, scope: string) => string): string {
    const pieces = name.split('.');
    let scope: string | undefined = this.scope;
    const out: string[] = [];
    pieces.forEach((piece, k) => {
      if (scope === undefined) out.push(piece);
      else if (k === pieces.length - 1) out.push(last(piece, scope));
      else {
        out.push(this.plan.designator(scope, piece) ?? piece);
        scope = this.plan.blockOf(scope, piece);
      }
    });
    return out.join('.');
  }

  private part(): void {
    const designator = this.tokens[0];
    this.replace(designator, this.plan.designator(this.scope, designator.text) ?? designator.text);
    const letter = designator.text[0];
    let i = this.nodeList(1);
    if (letter === 'U') {
      if (isName(this.tokens[i], OPAMP_WORD)) this.options(i + 1, false, OPAMP_OPTION_WORDS, { en: RETIRED.en, in: RETIRED.in }, []);
      return;
    }
    if (letter === 'A') {
      if (isName(this.tokens[i]) && (CONTROLLED_MODE_WORDS as string[]).includes(this.tokens[i].text)) i++;
      for (; i < this.tokens.length; i++) if (isName(this.tokens[i], 'of')) this.partRef(i + 1);
      return;
    }
    this.options(i, true, PASSIVE_OPTIONS, { noiseless: RETIRED.noiseless }, ['noiseless']);
  }

  /**
   * Walks a part's options from token `i` (after the part's own value when `valueFirst`):
   * a word of `words` (or a retired one) takes a value; `bare` words take none. Values are
   * skipped, so a parameter that happens to be called `in` is left alone.
   */
  private options(i: number, valueFirst: boolean, words: readonly string[], retired: Readonly<Record<string, string>>, bare: readonly string[]): void {
    let wantValue = valueFirst;
    for (; i < this.tokens.length; i++) {
      const t = this.tokens[i];
      if (wantValue) {
        i = this.skipValue(i);
        wantValue = false;
        continue;
      }
      if (t.kind === 'punct' && t.punct === '±') {
        wantValue = true;
        continue;
      }
      if (t.kind !== 'name') continue;
      const renamed = retired[t.text];
      if (renamed !== undefined) this.replace(t, renamed);
      wantValue = (words.includes(t.text) || renamed !== undefined) && !bare.includes(t.text);
    }
  }

  /** Skips one value starting at token `i` (a signed number, a name, a parenthesised expression, a unit after a number); returns its last index. */
  private skipValue(i: number): number {
    while (isPunct(this.tokens[i], '-') || isPunct(this.tokens[i], '+')) i++;
    const t = this.tokens[i];
    if (t === undefined) return i;
    if (isPunct(t, '(')) {
      let depth = 0;
      for (; i < this.tokens.length; i++) {
        if (isPunct(this.tokens[i], '(')) depth++;
        if (isPunct(this.tokens[i], ')') && --depth === 0) return i;
      }
      return i;
    }
    return t.kind === 'number' && separateUnit(this.tokens[i + 1]) !== null ? i + 1 : i;
  }

  private use(): void {
    const instance = instanceOf(this.tokens);
    if (instance === undefined) return;
    this.replace(instance, this.plan.designator(this.scope, instance.text) ?? instance.text);
    this.nodeList(4);
  }

  private drive(): void {
    let i = 1;
    if (isName(this.tokens[i], 'current') && this.tokens[i + 1] !== undefined) i++;
    if (isPunct(this.tokens[i], '[')) this.nodeList(i);
    else this.nodeRef(i);
  }

  private show(): void {
    let i = 1;
    if (this.tokens[i]?.kind === 'string') i++;
    const mode = this.tokens[i];
    if (
      isName(mode) &&
      (SHOW_MODES as readonly string[]).includes(mode.text) &&
      this.tokens[i + 1] !== undefined &&
      !isPunct(this.tokens[i + 1], '-') &&
      !isPunct(this.tokens[i + 1], '/')
    )
      i++;
    if (this.tokens[i]?.kind === 'string') i++;
    this.traceExpr(i, this.tokens.length);
  }

  /** What a trace shows, in tokens `from` .. `to`: `current R1`, `impedance …` or nodes. */
  private traceExpr(from: number, to: number): void {
    if (isName(this.tokens[from], 'current') && from + 1 < to) {
      this.partRef(from + 1);
      return;
    }
    if (isName(this.tokens[from], 'impedance') && from + 1 < to) from++;
    for (let i = from; i < to; i++) this.nodeRef(i);
  }

  private require(): void {
    const ops = ['>=', '<=', '=', '==', '>', '<'];
    const m = this.tokens.findIndex(
      (t, i) => i > 0 && t.kind === 'name' && (MEASURE_WORDS as string[]).includes(t.text) && ops.some((op) => isPunct(this.tokens[i + 1], op)),
    );
    if (m < 0) return;
    const target = this.tokens.slice(1, m);
    if (target.length === 1 && (target[0].kind === 'string' || this.labels.has(target[0].text))) return;
    let i = 1;
    if (isName(this.tokens[i]) && (SHOW_MODES as readonly string[]).includes(this.tokens[i].text) && i + 1 < m) i++;
    this.traceExpr(i, m);
  }

  /** `tolerance montecarlo N [seed S]` → `spread N draws [seed S]`; `tolerance worstcase` → `spread extremes`. */
  private tolerance(): void {
    const [keyword, mode] = this.tokens;
    if (!isName(mode)) return;
    if (mode.text === 'worstcase') {
      this.edits.push({ from: keyword.range.column - 1, to: mode.range.endColumn - 1, text: `${RETIRED.tolerance} ${RETIRED.worstcase}` });
      return;
    }
    if (mode.text !== 'montecarlo') return;
    const seed = this.tokens.findIndex((t) => isName(t, 'seed'));
    const last = (seed < 0 ? this.tokens.length : seed) - 1;
    if (last < 2) return;
    const written = this.line.text.slice(this.tokens[2].range.column - 1, this.tokens[last].range.endColumn - 1);
    this.edits.push({
      from: keyword.range.column - 1,
      to: this.tokens[last].range.endColumn - 1,
      text: `${RETIRED.tolerance} ${written} ${RETIRED.montecarlo}`,
    });
  }
}
