/** The statements that are not parts: let, drive, show, sweep, time, temperature, spread, require. */
import type { SourceRange } from '../circuit.js';
import type {
  DriveStatement,
  Ident,
  LetStatement,
  MeasureName,
  RequireStatement,
  RequireTarget,
  ShowMode,
  ShowStatement,
  SpreadStatement,
  SweepStatement,
  TemperatureStatement,
  TimeStatement,
  TraceExpr,
  Value,
} from '../ast.js';
import type { Punct, Token } from '../lexer.js';
import { didYouMean, suggestionHint } from '../suggest.js';
import { DEFAULT_TEMPERATURE, MEASURE_WORDS, RETIRED } from '../vocabulary.js';
import { StatementError, merge } from './cursor.js';
import { replaceWith } from '../diagnostic.js';
import type { Cursor } from './cursor.js';
import { ident, nodeList, nodeName, value } from './values.js';
import { canonicalWords, isSum, sumExpr } from './sums.js';

const MEASURE_LIST = MEASURE_WORDS.join(', ');
const TEMPERATURE_HINT = `write temperature 25°C or temperature 290 K; without this line it is ${DEFAULT_TEMPERATURE} K`;
const SPREAD_HINT = 'write spread 200 draws, spread 200 draws seed 7, or spread extremes';

export function letStatement(cur: Cursor): LetStatement | null {
  const keyword = cur.next() as Token;
  const name = ident(cur, 'the parameter’s name', 'let R = 10k');
  if (cur.isPunct('==')) {
    const t = cur.next() as Token;
    cur.report(t.range, 'bad-operator', '`==` is not how a parameter is set', 'write let NAME = VALUE', replaceWith('='));
  } else {
    cur.expect('=', 'missing-equals', `\`=\` is missing after ${name.name}`, `write let ${name.name} = VALUE`);
  }
  const rest = cur.tokens.slice(cur.pos);
  let v: Value | null;
  if (rest.length === 0) {
    v = value(cur, `the value of ${name.name}`);
  } else {
    const save = cur.pos;
    const diagCount = cur.diagnostics.length;
    const single = value(cur, `the value of ${name.name}`);
    if (single !== null && cur.atEnd()) {
      v = single;
    } else {
      // More than one value: the whole rest of the line is an expression (`2*Cb`).
      cur.pos = save;
      cur.diagnostics.length = diagCount;
      const last = rest[rest.length - 1];
      const range = merge(rest[0].range, last.range);
      v = { kind: 'expr', tokens: rest, text: cur.line.text.slice(rest[0].range.column - 1, last.range.endColumn - 1), range };
      cur.pos = cur.tokens.length;
    }
  }
  return { kind: 'let', name, value: v, range: merge(keyword.range, cur.whole()) };
}

export function driveStatement(cur: Cursor): DriveStatement {
  const keyword = cur.next() as Token;
  let source: DriveStatement['source'] = 'voltage';
  // `drive current [p n]` is a current drive; `drive current` alone drives a node named current.
  if (cur.isWord('current') && cur.peek(1) !== undefined) {
    cur.next();
    source = 'current';
  }
  let nodes: Ident[];
  let nodesRange: SourceRange;
  if (cur.isPunct('[')) {
    const list = nodeList(cur);
    if (list.nodes.length !== 2) {
      cur.report(
        list.range,
        'node-count',
        `a drive in brackets names 2 nodes; this has ${list.nodes.length === 0 ? 'none' : list.nodes.length}`,
        'write drive [p n], or drive NODE for a drive from gnd',
      );
    }
    nodes = list.nodes;
    nodesRange = list.range;
  } else {
    const node = nodeName(cur, 'the driven node');
    nodes = [node];
    nodesRange = node.range;
  }
  let amplitude: Value | null = null;
  let phase: Value | null = null;
  if (!cur.atEnd() && !cur.isWord('phase')) amplitude = value(cur, 'the amplitude', ['phase']);
  if (source === 'current' && amplitude === null && cur.atEnd()) {
    cur.report(cur.here(), 'missing-value', 'a current drive needs its amplitude in A', 'write drive current [p n] 1m');
  }
  if (cur.eat('phase') !== undefined) phase = value(cur, 'the phase', [], 'write phase 90 (degrees)');
  cur.finish('the drive', source === 'voltage' ? 'write drive NODE [AMPLITUDE] [phase DEG]' : 'write drive current [p n] AMPLITUDE [phase DEG]');
  return { kind: 'drive', source, nodes, nodesRange, amplitude, phase, range: merge(keyword.range, cur.whole()) };
}

/** The words of a trace expression in canonical spacing. */
function traceText(e: TraceExpr): string {
  switch (e.kind) {
    case 'node':
      return e.node.name;
    case 'difference':
      return `${e.p.name} - ${e.n.name}`;
    case 'ratio':
      return `${e.num.name} / ${e.den.name}`;
    case 'current':
      return `current ${e.element.name}`;
    case 'impedance':
      return e.n === null ? `impedance ${e.p.name}` : `impedance [${e.p.name} ${e.n.name}]`;
    case 'sum':
      return e.text;
    case 'break':
      return `at ${e.element.name}`;
  }
}

function traceExpr(cur: Cursor, mode: ShowMode): { expr: TraceExpr; range: SourceRange } {
  const start = cur.peek();
  if (start === undefined) {
    return cur.error(
      cur.here(),
      'missing-trace',
      'what to show is missing',
      'write show NODE, show NODE - NODE, show NODE / NODE, show 2 * NODE + NODE, show current R1 or show impedance NODE',
    );
  }
  let expr: TraceExpr;
  if (cur.isWord('current') && cur.peek(1) !== undefined) {
    cur.next();
    expr = { kind: 'current', element: ident(cur, 'the part after current', 'show current R1') };
  } else if (cur.isWord('impedance') && cur.peek(1) !== undefined) {
    cur.next();
    if (cur.isPunct('[')) {
      const list = nodeList(cur);
      if (list.nodes.length < 1 || list.nodes.length > 2) {
        cur.error(
          list.range,
          'node-count',
          `impedance in brackets names 2 nodes; this has ${list.nodes.length === 0 ? 'none' : list.nodes.length}`,
          'write show impedance [a b], or show impedance NODE for the impedance to gnd',
        );
      }
      expr = { kind: 'impedance', p: list.nodes[0], n: list.nodes[1] ?? null, bracketed: true };
    } else {
      expr = { kind: 'impedance', p: nodeName(cur, 'the node after impedance'), n: null, bracketed: false };
    }
  } else if (cur.isWord('at') && cur.peek(1)?.kind === 'name' && cur.peek(2) === undefined) {
    const at = cur.next() as Token;
    if (mode !== 'loop') {
      const name = (cur.peek() as Token).text;
      cur.error(merge(at.range, cur.here()), 'bad-trace', `at ${name} opens a loop, so it is shown as one`, `write show loop at ${name}`);
    }
    expr = { kind: 'break', element: ident(cur, 'the loop break after at', 'show loop at J1') };
  } else if (isSum(cur)) {
    expr = sumExpr(cur);
  } else {
    const a = nodeName(cur, 'the node to show');
    if (cur.isPunct('-') || cur.isPunct('/')) {
      const op = cur.next() as Token;
      const b = nodeName(cur, `the node after ${op.text}`);
      expr = op.punct === '-' ? { kind: 'difference', p: a, n: b } : { kind: 'ratio', num: a, den: b };
    } else {
      expr = { kind: 'node', node: a };
    }
  }
  const range = merge(start.range, cur.tokens[cur.pos - 1].range);
  const allowed: Record<ShowMode, TraceExpr['kind'][]> = {
    plain: ['node', 'difference', 'ratio', 'current', 'impedance', 'sum'],
    loop: ['node', 'difference', 'ratio', 'sum', 'break'],
    step: ['node', 'difference', 'ratio', 'current', 'sum'],
    noise: ['node'],
  };
  if (!allowed[mode].includes(expr.kind)) {
    const hint = {
      plain: '',
      loop: 'a loop gain is a node, a difference, a sum or a ratio of node voltages: show loop out / in',
      step: 'a step response is of a node, a difference, a sum, a ratio or a current: show step out',
      noise: 'output noise is shown at one node: show noise out',
    }[mode];
    cur.error(range, 'bad-trace', `show ${mode} cannot show ${traceText(expr)}`, hint);
  }
  return { expr, range };
}

export function showStatement(cur: Cursor): ShowStatement {
  const keyword = cur.next() as Token;
  let label: ShowStatement['label'] = null;
  const takeLabel = () => {
    const t = cur.peek();
    if (t !== undefined && t.kind === 'string') {
      cur.next();
      if (label !== null) cur.report(t.range, 'unexpected-token', 'this trace has a label already');
      if (t.text.trim() === '') cur.report(t.range, 'empty-label', 'a label cannot be empty', 'write a few words between the quotes, or leave the label out');
      label = { text: t.text.trim(), range: t.range };
    }
  };
  takeLabel();
  let mode: ShowMode = 'plain';
  for (const m of ['loop', 'step', 'noise'] as const) {
    // `loop - x` is the node loop minus x; `loop -1 * x` is a loop trace of a sum.
    const operand = cur.isPunct('-', 1) && cur.peek(2)?.kind === 'name';
    if (cur.isWord(m) && cur.peek(1) !== undefined && !operand && !(['/', '+', '*'] as const).some((p) => cur.isPunct(p, 1))) {
      cur.next();
      mode = m;
      break;
    }
  }
  takeLabel();
  const { expr, range } = traceExpr(cur, mode);
  cur.finish(`the trace`, 'a show line shows one trace: a sum is written out + a, and another trace goes on a show line of its own');
  return { kind: 'show', label, mode, expr, exprText: traceText(expr), exprRange: range, range: merge(keyword.range, cur.whole()) };
}

export function sweepStatement(cur: Cursor): SweepStatement {
  const keyword = cur.next() as Token;
  const hint = 'write sweep 10 .. 100k, sweep 10 .. 100k, 50/decade, sweep 0 .. 10k, 101 linear or sweep at 1k, 2k, 5k';
  if (cur.eat('at') !== undefined) {
    const frequencies: Value[] = [];
    for (;;) {
      const f = value(cur, 'a frequency after at');
      if (f === null) break;
      frequencies.push(f);
      if (cur.eat(',') === undefined) break;
    }
    cur.finish('the list of frequencies', 'separate the frequencies with commas: sweep at 1k, 2k, 5k');
    return { kind: 'sweep', form: 'list', frequencies, range: merge(keyword.range, cur.whole()) };
  }
  const from = value(cur, 'the start frequency');
  if (from === null) throw new StatementError('sweep');
  if (!cur.isPunct('..')) cur.error(cur.here(), 'missing-range', 'a sweep range is written with `..` between its ends', hint);
  cur.next();
  const to = value(cur, 'the stop frequency');
  if (to === null) throw new StatementError('sweep');
  if (cur.eat(',') === undefined) {
    cur.finish('the sweep range', hint);
    return { kind: 'sweep', form: 'log', from, to, perDecade: null, range: merge(keyword.range, cur.whole()) };
  }
  const count = value(cur, 'the count of points');
  if (count === null) throw new StatementError('sweep');
  if (cur.eat('linear') !== undefined) {
    cur.finish('the sweep', hint);
    return { kind: 'sweep', form: 'linear', from, to, points: count, range: merge(keyword.range, cur.whole()) };
  }
  if (cur.eat('/') !== undefined) {
    const unit = cur.peek();
    if (unit !== undefined && unit.kind === 'name' && unit.text === 'decade') {
      cur.next();
    } else if (unit !== undefined && unit.kind === 'name' && ['dec', 'decades', 'dekade', 'decad', 'decde'].includes(unit.text)) {
      cur.report(unit.range, 'bad-sweep', `\`${unit.text}\` should be decade`, 'write N/decade', replaceWith('decade'));
      cur.next();
    } else {
      cur.error(cur.here(), 'bad-sweep', 'a log sweep’s density is written N/decade', hint);
    }
    cur.finish('the sweep', hint);
    return { kind: 'sweep', form: 'log', from, to, perDecade: count, range: merge(keyword.range, cur.whole()) };
  }
  return cur.error(cur.here(), 'bad-sweep', 'after the comma comes N/decade or N linear', hint);
}

export function timeStatement(cur: Cursor): TimeStatement {
  const keyword = cur.next() as Token;
  const from = value(cur, 'the start time');
  if (from === null) throw new StatementError('time');
  cur.expect('..', 'missing-range', 'a time window is written with `..` between its ends', 'write time 0 .. 10m, or time 0 .. 10m, 1000 points');
  const to = value(cur, 'the end time');
  if (to === null) throw new StatementError('time');
  let points: Value | null = null;
  if (cur.eat(',') !== undefined) {
    points = value(cur, 'the count of points');
    cur.expect('points', 'bad-time', 'after the comma comes N points', 'write time 0 .. 10m, 1000 points');
  }
  cur.finish('the time window', 'write time 0 .. 10m, or time 0 .. 10m, 1000 points');
  return { kind: 'time', from, to, points, range: merge(keyword.range, cur.whole()) };
}

export function temperatureStatement(cur: Cursor): TemperatureStatement {
  const keyword = cur.next() as Token;
  const v = value(cur, 'the temperature', [], TEMPERATURE_HINT);
  if (v === null) throw new StatementError('temperature');
  cur.finish('the temperature', TEMPERATURE_HINT);
  return { kind: 'temperature', value: v, range: merge(keyword.range, cur.whole()) };
}

/** `spread N draws [seed S]` or `spread extremes`. */
export function spreadStatement(cur: Cursor): SpreadStatement {
  const keyword = cur.next() as Token;
  const first = cur.peek();
  if (first !== undefined && first.kind === 'name' && cur.peek(1) === undefined && !cur.isWord('extremes')) {
    const near = didYouMean(first.text, ['extremes']);
    if (near.fix !== undefined) cur.error(first.range, 'bad-spread', `\`${first.text}\` is not a kind of spread`, suggestionHint(near, SPREAD_HINT), near.fix);
  }
  if (cur.eat('extremes') !== undefined) {
    cur.finish('extremes', SPREAD_HINT);
    return { kind: 'spread', mode: 'extremes', draws: null, seed: null, range: merge(keyword.range, cur.whole()) };
  }
  const draws = value(cur, 'the count of draws', ['draws', 'seed', 'extremes'], SPREAD_HINT);
  if (draws === null) throw new StatementError('spread');
  if (cur.eat('draws') === undefined) {
    const t = cur.peek();
    const near = t !== undefined && t.kind === 'name' ? didYouMean(t.text, ['draws']) : undefined;
    if (t !== undefined && near?.fix !== undefined) cur.error(t.range, 'bad-spread', `\`${t.text}\` should be draws`, SPREAD_HINT, near.fix);
    const end = draws.range.endColumn;
    cur.error(t?.range ?? draws.range, 'bad-spread', 'the count of draws is followed by the word draws', SPREAD_HINT, {
      title: 'Add draws',
      replacement: ' draws',
      range: { line: draws.range.line, column: end, endColumn: end },
    });
  }
  let seed: Value | null = null;
  if (cur.eat('seed') !== undefined) seed = value(cur, 'the seed', [], SPREAD_HINT);
  cur.finish('the spread', SPREAD_HINT);
  return { kind: 'spread', mode: 'draws', draws, seed, range: merge(keyword.range, cur.whole()) };
}

/**
 * `tolerance montecarlo N [seed S]` and `tolerance worstcase`, the earlier forms of
 * `spread`: an error whose quick fix rewrites the line; read as the spread it stands for.
 */
export function retiredToleranceStatement(cur: Cursor): SpreadStatement {
  cur.next();
  const word = cur.next();
  const range = cur.whole();
  const source = (v: Value) => cur.line.text.slice(v.range.column - 1, v.range.endColumn - 1);
  const report = (replacement?: string) =>
    cur.report(
      range,
      'retired-word',
      '`tolerance` is an earlier form of the language',
      replacement === undefined ? SPREAD_HINT : `write ${replacement}`,
      replacement === undefined ? undefined : replaceWith(replacement),
    );
  if (word !== undefined && word.kind === 'name' && word.text === 'worstcase') {
    report(`${RETIRED.tolerance} ${RETIRED.worstcase}`);
    return { kind: 'spread', mode: 'extremes', draws: null, seed: null, range };
  }
  if (word === undefined || word.kind !== 'name' || word.text !== 'montecarlo') {
    report();
    throw new StatementError('tolerance');
  }
  const diagnosticCount = cur.diagnostics.length;
  const draws = value(cur, 'the count of draws', ['seed']);
  const seed = cur.eat('seed') !== undefined ? value(cur, 'the seed') : null;
  if (draws === null || !cur.atEnd() || cur.diagnostics.length > diagnosticCount) {
    report();
    throw new StatementError('tolerance');
  }
  report(`${RETIRED.tolerance} ${source(draws)} ${RETIRED.montecarlo}${seed === null ? '' : ` seed ${source(seed)}`}`);
  return { kind: 'spread', mode: 'draws', draws, seed, range };
}

const OPS: Partial<Record<Punct, { op: '>=' | '<=' | '='; fix?: string }>> = {
  '>=': { op: '>=' },
  '<=': { op: '<=' },
  '=': { op: '=' },
  '==': { op: '=', fix: '=' },
  '>': { op: '>=', fix: '>=' },
  '<': { op: '<=', fix: '<=' },
};

function isOp(t: Token | undefined): boolean {
  return t !== undefined && t.kind === 'punct' && t.punct !== undefined && OPS[t.punct] !== undefined;
}

export function requireStatement(cur: Cursor): RequireStatement {
  const keyword = cur.next() as Token;
  const hint = 'write require TARGET MEASURE OP VALUE, like require out gain >= -3 dB over 10 .. 1k';
  const tokens = cur.tokens;
  // The measure is the first measure word after the target that is followed by an operator.
  let m = -1;
  for (let i = cur.pos; i < tokens.length; i++) {
    if (tokens[i].kind === 'name' && (MEASURE_WORDS as string[]).includes(tokens[i].text) && isOp(tokens[i + 1])) {
      m = i;
      break;
    }
  }
  if (m < 0) {
    for (let i = cur.pos + 1; i < tokens.length; i++) {
      const t = tokens[i];
      if (isOp(tokens[i + 1]) && t.kind === 'name') {
        const near = didYouMean(t.text, MEASURE_WORDS);
        cur.error(
          t.range,
          'unknown-measure',
          `\`${t.text}\` is not a measure`,
          suggestionHint(near, `the measures are ${MEASURE_LIST}.`, `The measures are ${MEASURE_LIST}.`),
          near.fix,
        );
      }
    }
    if (cur.atEnd()) cur.error(keyword.range, 'missing-target', 'what to require is missing', hint);
    cur.error(cur.whole(), 'missing-measure', 'this requirement has no measure and comparison', `${hint}; the measures are ${MEASURE_LIST}`);
  }
  const targetTokens = tokens.slice(cur.pos, m);
  if (targetTokens.length === 0) cur.error(tokens[m].range, 'missing-target', 'the trace this requirement is about is missing', hint);
  const target = requireTarget(targetTokens);
  cur.pos = m;
  const measureToken = cur.next() as Token;
  const measure = { name: measureToken.text as MeasureName, range: measureToken.range };
  const opToken = cur.next() as Token;
  const opInfo = OPS[opToken.punct as Punct] as { op: '>=' | '<=' | '='; fix?: string };
  if (opInfo.fix !== undefined) {
    cur.report(
      opToken.range,
      'bad-operator',
      `\`${opToken.text}\` is not a comparison here`,
      `the comparisons are >=, <= and = VALUE ± TOL`,
      replaceWith(opInfo.fix),
    );
  }
  const v = value(cur, 'the value to compare with', ['over', 'at']);
  if (v === null) throw new StatementError('require');
  let tolerance: Value | null = null;
  if (cur.eat('±') !== undefined) {
    tolerance = value(cur, 'the tolerance after ±');
    if (opInfo.op !== '=')
      cur.report(
        tolerance?.range ?? opToken.range,
        'bad-tolerance',
        `a tolerance goes with =, not with ${opInfo.op}`,
        'write = VALUE ± TOL, or drop the tolerance',
      );
  } else if (opInfo.op === '=') {
    cur.report(v.range, 'missing-tolerance', '= needs a tolerance', `write = ${v.kind === 'number' ? v.text : 'VALUE'} ± 2% or give an absolute tolerance`);
  }
  let over: RequireStatement['over'] = null;
  let at: Value | null = null;
  const overToken = cur.eat('over');
  if (overToken !== undefined) {
    let from: Value | null = null;
    let to: Value | null = null;
    if (!cur.isPunct('..')) from = value(cur, 'the start of the range');
    if (from !== null || cur.isPunct('..')) {
      cur.expect('..', 'missing-range', 'a range is written F1 .. F2, F1 .. or .. F2', 'write over 10 .. 1k');
      if (!cur.atEnd()) to = value(cur, 'the end of the range');
      else if (from === null) cur.report(cur.here(), 'missing-range', 'a range needs at least one end', 'write over 10 .. 1k');
    }
    over = { from, to, range: merge(overToken.range, cur.tokens[cur.pos - 1].range) };
  } else if (cur.eat('at') !== undefined) {
    at = value(cur, 'the frequency after at');
  }
  cur.finish('the requirement', hint);
  const whole = cur.whole();
  const text = cur.line.text.slice(whole.column - 1, whole.endColumn - 1).trim();
  return {
    kind: 'require',
    target,
    measure,
    op: { op: opInfo.op, range: opToken.range },
    value: v,
    tolerance,
    over,
    at,
    text,
    range: merge(keyword.range, whole),
  };
}

/** The target's words in the same canonical form as a `show` line's (`loop out / in`). */
function requireTarget(tokens: Token[]): RequireTarget {
  const range = merge(tokens[0].range, tokens[tokens.length - 1].range);
  if (tokens.length === 1 && tokens[0].kind === 'string') return { text: tokens[0].text.trim(), quoted: true, range };
  return { text: canonicalWords(tokens), quoted: false, range };
}
