/** `vary NAME over V1, V2, …` and `vary NAME over V1 .. V2, N values [linear]`: the values a parameter steps through. */
import type { Value, VaryStatement } from '../ast.js';
import type { Token } from '../lexer.js';
import { replaceWith } from '../diagnostic.js';
import { didYouMean, suggestionHint } from '../suggest.js';
import { CONNECTIVES } from '../vocabulary.js';
import { StatementError, merge, show } from './cursor.js';
import type { Cursor } from './cursor.js';
import { ident, value } from './values.js';

const [OVER, VALUES, LINEAR] = CONNECTIVES.vary;
const HINT = `write vary R ${OVER} 1k, 10k, 100k, or vary R ${OVER} 1k .. 100k, 5 ${VALUES}`;
const RANGE_HINT = `a range of values is written vary R ${OVER} 1k .. 100k, 5 ${VALUES} (spaced by equal ratios) or 5 ${VALUES} ${LINEAR} (evenly spaced)`;
/** Words a designer may reach for in place of `values`. */
const COUNT_WORDS = ['steps', 'step', 'points', 'variants', 'value'];

export function varyStatement(cur: Cursor): VaryStatement {
  const keyword = cur.next() as Token;
  if (cur.isWord(OVER)) cur.error(cur.here(), 'missing-name', 'the parameter to vary is missing', `write it like vary R ${OVER} 1k, 10k`);
  const name = ident(cur, 'the parameter to vary', `vary R ${OVER} 1k, 10k`);
  if (cur.eat(OVER) === undefined) {
    const t = cur.peek();
    if (t !== undefined && t.kind === 'name') {
      const near = didYouMean(t.text, [OVER]);
      if (near.fix !== undefined) cur.error(t.range, 'bad-vary', `\`${t.text}\` should be ${OVER}`, suggestionHint(near, HINT), near.fix);
    }
    cur.error(t?.range ?? name.range, 'bad-vary', `\`${OVER}\` and the values to try come after ${name.name}`, HINT);
  }
  if (cur.atEnd()) cur.error(cur.here(), 'vary-empty', `vary ${name.name} lists no values`, HINT);
  const first = varyValue(cur, 'the first value');
  if (cur.eat('..') !== undefined) {
    const to = varyValue(cur, 'the end of the range');
    if (cur.eat(',') === undefined) cur.error(cur.here(), 'bad-vary', 'a range of values ends with the count of values', RANGE_HINT);
    const count = value(cur, 'the count of values', [VALUES, LINEAR], RANGE_HINT);
    if (count === null) throw new StatementError('vary');
    const word = cur.peek();
    if (cur.eat(VALUES) === undefined) {
      if (word !== undefined && word.kind === 'name' && COUNT_WORDS.includes(word.text)) {
        cur.error(word.range, 'bad-vary', `the count is followed by the word ${VALUES}, the ends included`, RANGE_HINT, replaceWith(VALUES));
      }
      cur.error(word?.range ?? count.range, 'bad-vary', `the count of values is followed by the word ${VALUES}`, RANGE_HINT);
    }
    const linear = cur.eat(LINEAR) !== undefined;
    cur.finish('the range of values', RANGE_HINT);
    return { kind: 'vary', name, form: 'range', from: first, to, count, linear, range: merge(keyword.range, cur.whole()) };
  }
  const values = [first];
  while (cur.eat(',') !== undefined) values.push(varyValue(cur, 'a value after the comma'));
  cur.finish('the list of values', 'separate the values with commas: vary R over 1k, 10k, 100k');
  return { kind: 'vary', name, form: 'list', values, range: merge(keyword.range, cur.whole()) };
}

/** One value of the list or an end of the range: a number, a parameter or an expression; anything else stops the line. */
function varyValue(cur: Cursor, what: string): Value {
  const t = cur.peek();
  if (t !== undefined && (t.kind === 'string' || (t.kind === 'punct' && t.punct !== '(' && t.punct !== '-' && t.punct !== '+'))) {
    cur.error(
      t.range,
      'bad-vary-value',
      `\`${show(t)}\` is not a value: vary steps through numbers`,
      'write numbers like 10k or 4n7, parameters, or expressions in parentheses',
    );
  }
  const v = value(cur, what, [VALUES, LINEAR], HINT);
  if (v === null) throw new StatementError('vary');
  return v;
}
