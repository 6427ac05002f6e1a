/** Values, names and node lists: the pieces that statements are made of. */
import type { Ident, NodeList, Value } from '../ast.js';
import { describeSuffixProblem, separateUnit } from '../lexer.js';
import type { Token } from '../lexer.js';
import { readSuffix } from '../units.js';
import { SI_PREFIXES, isDigitsOnly } from '../vocabulary.js';
import { merge, show } from './cursor.js';
import { replaceWith } from '../diagnostic.js';
import type { Cursor } from './cursor.js';

/**
 * Reads a value: a number (with a unit written on it or standing after it), a parameter
 * name, or an expression in parentheses. A leading minus sign is allowed. Returns null,
 * with a diagnostic, when there is no value here.
 */
export function value(cur: Cursor, what: string, stopWords: readonly string[] = [], hint?: string): Value | null {
  const t = cur.peek();
  const missing = () => {
    cur.report(t?.range ?? cur.here(), 'missing-value', `${what} is missing`, hint);
    return null;
  };
  if (t === undefined) return missing();
  if (t.kind === 'punct' && (t.punct === '-' || t.punct === '+')) {
    const after = cur.peek(1);
    if (after !== undefined && (after.kind === 'number' || after.kind === 'name' || (after.kind === 'punct' && after.punct === '('))) {
      cur.next();
      const inner = value(cur, what, stopWords, hint);
      if (inner === null) return null;
      const range = merge(t.range, inner.range);
      if (t.punct === '+') return { ...inner, range };
      if (inner.kind === 'number') return { ...inner, value: -inner.value, text: '-' + inner.text, range };
      const paren = (p: '(' | ')'): Token => ({ kind: 'punct', text: p, punct: p, range: inner.range, spaced: false });
      const tokens = inner.kind === 'expr' ? [t, paren('('), ...inner.tokens, paren(')')] : [t, nameToken(inner)];
      return { kind: 'expr', tokens, text: '-' + (inner.kind === 'expr' ? `(${inner.text})` : inner.name), range };
    }
    return missing();
  }
  if (t.kind === 'number') {
    cur.next();
    const v: Value = { kind: 'number', value: t.value ?? NaN, unit: t.unit ?? null, text: t.text, range: t.range };
    if (t.prefixed === true) v.prefixed = true;
    if (t.bad === true) v.bad = true;
    if (t.unitRange !== undefined && t.unit !== null && t.unit !== undefined) v.unitRange = t.unitRange;
    const u = cur.peek();
    const apart = separateUnit(u);
    if (apart !== null && u !== undefined) {
      if (v.unit !== null || t.bad) {
        cur.report(u.range, 'unexpected-token', `\`${t.text}\` already has a unit; \`${u.text}\` is one too many`);
      } else if (apart.prefixed && t.prefixed === true) {
        cur.report(u.range, 'unexpected-token', `\`${t.text}\` has an SI prefix already; \`${u.text}\` would add a second`, `write ${t.text}${apart.unit}`);
      } else {
        v.value *= apart.multiplier;
        if (apart.prefixed) v.prefixed = true;
        v.unit = apart.unit;
        v.unitRange = u.range;
        v.text = `${t.text} ${u.text}`;
        v.range = merge(t.range, u.range);
      }
      cur.next();
    } else if (u !== undefined && u.kind === 'name' && SI_PREFIXES[u.text] !== undefined && v.unit === null && t.unitRange === undefined) {
      // A prefix standing apart from its digits: `10 k`.
      cur.report(u.range, 'spaced-prefix', `the prefix ${u.text} goes straight after the digits`, `write ${t.text}${u.text}`, {
        title: `Write ${t.text}${u.text}`,
        replacement: '',
        range: { line: t.range.line, column: t.range.endColumn, endColumn: u.range.column },
      });
      v.bad = true;
      cur.next();
    } else if (u !== undefined && u.kind === 'name') {
      // A misspelt unit standing apart: `-3 db`, `10 hz`, `1 KHz`.
      const reading = readSuffix(u.text);
      if (reading.kind === 'bad' && reading.reason.kind !== 'unknown') {
        const col = u.range.column - 1;
        describeSuffixProblem(reading.reason, '', col, col + u.text.length, (start, end, code, message, hint, fix) => {
          const range = { line: u.range.line, column: start + 1, endColumn: end + 1 };
          const qf =
            fix === undefined
              ? undefined
              : replaceWith(fix.replacement, { line: u.range.line, column: (fix.start ?? start) + 1, endColumn: (fix.end ?? end) + 1 });
          cur.report(range, code, message, hint, qf);
        });
        v.bad = true;
        cur.next();
      }
    }
    return v;
  }
  if (t.kind === 'name') {
    if (stopWords.includes(t.text)) return missing();
    cur.next();
    return { kind: 'name', name: t.text, range: t.range };
  }
  if (t.kind === 'punct' && t.punct === '(') {
    return parenthesised(cur);
  }
  if (t.kind === 'unit') {
    cur.error(t.range, 'misplaced-unit', `the unit \`${t.text}\` needs a number before it`, 'write the unit straight after the number, like 10kΩ');
  }
  return missing();
}

function nameToken(v: Value & { kind: 'name' }): Token {
  return { kind: 'name', text: v.name, range: v.range, spaced: true };
}

/** `( … )` with the parentheses balanced; the tokens inside become an expression. */
function parenthesised(cur: Cursor): Value {
  const open = cur.next() as Token;
  let depth = 1;
  const tokens: Token[] = [];
  while (!cur.atEnd()) {
    const t = cur.next() as Token;
    if (t.kind === 'punct' && t.punct === '(') depth++;
    if (t.kind === 'punct' && t.punct === ')') {
      depth--;
      if (depth === 0) {
        const range = merge(open.range, t.range);
        return { kind: 'expr', tokens, text: cur.line.text.slice(open.range.column, t.range.column - 1).trim(), range };
      }
    }
    tokens.push(t);
  }
  return cur.error(open.range, 'unclosed-parenthesis', 'this `(` is never closed', 'an expression in parentheses ends with `)` on the same line');
}

export function ident(cur: Cursor, what: string, example: string): Ident {
  const t = cur.peek();
  if (t === undefined || t.kind !== 'name') {
    return cur.error(cur.here(), 'missing-name', `${what} is missing`, `write it like ${example}`);
  }
  cur.next();
  return { name: t.text, range: t.range };
}

const NODE_NAME_HINT = 'a node name starts with a letter or _, such as out, n2 or _x; ground is gnd';

/**
 * A node: a name. Digits only are the earlier forms, an error with the quick fix to the
 * new name (`0` → gnd, `12` → n12); `0` is then read as gnd and other digits as written.
 */
export function nodeName(cur: Cursor, what: string): Ident {
  const t = cur.peek();
  if (t !== undefined && t.kind === 'name') {
    cur.next();
    return { name: t.text, range: t.range };
  }
  if (t !== undefined && t.kind === 'number' && isDigitsOnly(t.text)) {
    cur.next();
    const renamed = cur.plan().node(t.text);
    if (t.text === '0') {
      cur.report(t.range, 'ground-is-gnd', 'ground is written gnd, not 0', 'the ground node has one name, gnd', {
        title: 'Replace with gnd',
        replacement: renamed,
      });
      return { name: renamed, range: t.range };
    }
    cur.report(
      t.range,
      'digit-node',
      `\`${t.text}\` cannot be a node name: a node name starts with a letter or _`,
      `write ${renamed}, or a name that says what the node is, like out`,
      replaceWith(renamed),
    );
    return { name: t.text, range: t.range };
  }
  if (t !== undefined && t.kind === 'number') {
    return cur.error(t.range, 'bad-node-name', `\`${t.text}\` cannot be a node name`, NODE_NAME_HINT);
  }
  return cur.error(cur.here(), 'missing-node', `${what} is missing`, NODE_NAME_HINT);
}

export function nodeList(cur: Cursor): NodeList {
  const open = cur.next() as Token;
  if (!cur.tokens.slice(cur.pos).some((t) => t.kind === 'punct' && t.punct === ']')) {
    return cur.error(open.range, 'unclosed-bracket', 'this `[` is never closed', 'a node list ends with `]`, like [a b]');
  }
  const nodes: Ident[] = [];
  while (!cur.atEnd() && !cur.isPunct(']')) {
    const t = cur.peek() as Token;
    if (t.kind === 'punct' && t.punct === ',') {
      cur.next();
      continue;
    }
    if (t.kind === 'name' || t.kind === 'number') {
      nodes.push(nodeName(cur, 'a node'));
      continue;
    }
    cur.error(t.range, 'bad-node-name', `\`${show(t)}\` cannot be a node name`, NODE_NAME_HINT);
  }
  const close = cur.peek();
  if (close === undefined) {
    return cur.error(open.range, 'unclosed-bracket', 'this `[` is never closed', 'a node list ends with `]`, like [a b]');
  }
  cur.next();
  return { nodes, range: merge(open.range, close.range) };
}
