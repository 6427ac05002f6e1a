/**
 * `npm run bench`: how fast the numerical core is, against its targets.
 *
 * (a) a 12-part active filter cell, compile + analyze at 1 001 points (target < 5 ms);
 * (b) RC ladders of 100 … 100 000 sections at 200 points (target: near-linear growth,
 *     10 000 sections under 0.5 s);
 * (c) the same systems, assembled by the same MNA code, solved by building a mathjs complex
 *     matrix and calling mathjs `lusolve` at every point (target: (a) at least 50× faster).
 *     The baseline runs only on the small systems, and on fewer points where it is slow
 *     (then scaled to the full count, as marked);
 * (d) compiling long cells: a 20 000-part ladder, and 20 000 parts each leaving a node
 *     dangling (every mistake found and counted) (target: each under 2 s).
 */
import * as math from 'mathjs';
import { analyze, analyzeCircuit } from '../src/analyze.js';
import { compile } from '../src/compile.js';
import { solveCircuit } from '../src/analysis.js';
import { assemble, buildMna } from '../src/mna.js';
import type { Circuit, Element } from '../src/circuit.js';

const FILTER = `# 4th-order Butterworth low-pass at 1 kHz: two Sallen–Key sections and an output RC
let R = 10k
drive in
R1 [in a1] R
R2 [a1 b1] R
C1 [a1 o1] 41.59n
C2 [b1 gnd] 6.091n
U1 [b1 o1 o1] opamp gain 100dB gbw 10M
R3 [o1 a2] R
R4 [a2 b2] R
C3 [a2 o2] 17.23n
C4 [b2 gnd] 14.70n
U2 [b2 o2 o2] opamp gain 100dB gbw 10M
R5 [o2 out] 100
C5 [out gnd] 10n
show out
sweep 10 .. 1M, 200/decade
require out gain >= -0.1 dB over 10 .. 300
require out corner = 1k ± 1%
require out gain <= -75 dB over 10k .. 100k
`;

function median(run: () => void, repeats: number, warmup = Math.min(repeats, 50)): number {
  for (let i = 0; i < warmup; i++) run();
  const times: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    run();
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  return times[times.length >> 1];
}

/** An RC ladder of n sections, 1 kΩ and 1 µF in total, 200 log-spaced points 1 Hz .. 10 MHz. */
function ladder(n: number, points = 200): Circuit {
  const at = { line: 1, column: 1, endColumn: 1 };
  const nodeNames = ['gnd'];
  for (let k = 0; k <= n; k++) nodeNames.push(`n${k}`);
  const elements: Element[] = [];
  for (let k = 0; k < n; k++) {
    elements.push({ kind: 'resistor', name: `R${k}`, range: at, a: k + 1, b: k + 2, value: 1e3 / n, noiseless: false });
    elements.push({ kind: 'capacitor', name: `C${k}`, range: at, a: k + 2, b: 0, value: 1e-6 / n, esr: 0, esl: 0 });
  }
  const frequencies = Array.from({ length: points }, (_, i) => Math.pow(10, (7 * i) / 199));
  return {
    nodeNames,
    elements,
    drive: { kind: 'voltage', p: 1, n: 0, amplitude: 1, phaseDeg: 0, range: at },
    traces: [{ label: 'out', expr: `n${n}`, kind: 'ratio', probe: { kind: 'voltage', p: n + 1, n: 0 }, unit: 'V/V', range: at }],
    sweep: { kind: 'list', frequencies },
    requirements: [],
    tolerance: null,
    temperature: 300,
    time: null,
  };
}

/** mathjs baseline: per frequency, a dense mathjs complex matrix and lusolve. Returns ms per point. */
function mathjsPerPoint(circuit: Circuit, frequencies: number[]): number {
  const sys = buildMna(circuit).system!;
  const n = sys.n;
  const re = new Float64Array(sys.rows.length);
  const im = new Float64Array(sys.rows.length);
  const b = math.matrix(Array.from({ length: n }, (_, i) => [math.complex(sys.driveRhs!.index.includes(i) ? 1 : 0, 0)]));
  const t0 = performance.now();
  for (const f of frequencies) {
    assemble(sys, 2 * Math.PI * f, re, im);
    const rows: math.Complex[][] = Array.from({ length: n }, () => Array.from({ length: n }, () => math.complex(0, 0)));
    for (let k = 0; k < sys.rows.length; k++) rows[sys.rows[k]][sys.cols[k]] = math.complex(re[k], im[k]);
    math.lusolve(math.matrix(rows), b);
  }
  return (performance.now() - t0) / frequencies.length;
}

const lines: string[] = [];
const row = (...cells: string[]): void => {
  lines.push(cells.map((c, i) => (i === 0 ? c.padEnd(50) : c.padStart(i === 3 ? 20 : 14))).join(''));
};
const ms = (x: number): string => (x >= 100 ? x.toFixed(0) : x >= 10 ? x.toFixed(1) : x.toFixed(3)) + ' ms';

// (a)
const compiled = compile(FILTER);
if (!compiled.circuit) throw new Error(JSON.stringify(compiled.diagnostics));
const filterResult = analyze(FILTER);
const points = filterResult.frequencies.length;
const parts = compiled.circuit.elements.length;
const tAnalyze = median(() => analyze(FILTER), 300);
const tCompile = median(() => compile(FILTER), 300);
const tSweep = median(() => solveCircuit(compiled.circuit!), 300);
const filterFreqs = Array.from(filterResult.frequencies);
const baselineA = mathjsPerPoint(compiled.circuit, filterFreqs) * points;

row('case', 'time', 'per point', 'target');
row(`(a) ${parts}-part filter, compile + analyze, ${points} pts`, ms(tAnalyze), `${((tAnalyze / points) * 1000).toFixed(2)} µs`, '< 5 ms');
row('    compile only', ms(tCompile), '', '');
row('    sweep solve only (no readouts)', ms(tSweep), `${((tSweep / points) * 1000).toFixed(2)} µs`, '');
row(`(c) mathjs lusolve baseline, same ${points} pts`, ms(baselineA), `${((baselineA / points) * 1000).toFixed(1)} µs`, '');
row('    speed-up, full analyze vs baseline', `${(baselineA / tAnalyze).toFixed(0)}×`, '', '≥ 50×');
row('    speed-up, sweep solve vs baseline', `${(baselineA / tSweep).toFixed(0)}×`, '', '');
lines.push('');

// (b) and (c) for the ladders
row('(b) RC ladder, 200 points', 'analyze', 'per section', 'mathjs');
let previous = 0;
for (const n of [100, 1000, 10000, 100000]) {
  const c = ladder(n);
  // 10 000 sections carries issue 13's budget, so it gets a warm-up and a median too.
  const repeats = n <= 1000 ? 5 : n === 10000 ? 3 : 1;
  const t = median(() => analyzeCircuit(c), repeats, n <= 1000 ? 2 : n === 10000 ? 1 : 0);
  let base = n === 10000 ? 'target < 0.5 s' : '—';
  if (n <= 100) {
    const sample = (c.sweep as { frequencies: number[] }).frequencies.filter((_, i) => i % 10 === 0);
    const baseline = mathjsPerPoint(c, sample) * 200;
    base = `${ms(baseline)}* ${(baseline / t).toFixed(0)}×`;
  }
  const growth = previous > 0 ? `  ×${(t / previous).toFixed(1)} for ×10` : '';
  row(`    ${n.toLocaleString('en-US')} sections${growth}`, ms(t), `${((t / n) * 1000).toFixed(2)} µs`, base);
  previous = t;
}
lines.push('');
lines.push('* mathjs on 20 of the 200 points, scaled to 200; larger ladders are not run on the baseline');
lines.push('  (a dense 1 000-unknown mathjs solve takes seconds per point).');
lines.push('');

// (d) long cells, compile only
const longLadder = ['drive in', 'R0 [in n1] 1k'];
for (let i = 1; i < 20000; i++) longLadder.push(`R${i} [n${i} n${i + 1}] 1k`);
longLadder.push('R20000 [n20000 gnd] 1k', 'show n20000');
const dangling = ['drive in'];
for (let i = 0; i < 20000; i++) dangling.push(`R${i} [in n${i}] 1k`);
dangling.push('show in');
row('(d) compile a long cell', 'compile', '', 'target');
row('    20 000-part ladder', ms(median(() => compile(longLadder.join('\n')), 3, 1)), '', '< 2 s');
row('    20 000 parts, each with a dangling node', ms(median(() => compile(dangling.join('\n')), 3, 1)), '', '< 2 s');

// (e) the step response of a 12-part active filter: two Sallen–Key stages, 4th-order Butterworth at 1 kHz
const fourthOrder = `drive in
R1 [in a] 10k
R2 [a b] 10k
C1 [a c] 21.6n esr 20m
C2 [b gnd] 11.7n
U1 [b c c] opamp gain 100dB gbw 1M
R3 [c d] 10k
R4 [d e] 10k
C3 [d out] 52.3n esr 20m
C4 [e gnd] 4.85n
U2 [e out out] opamp gain 100dB gbw 1M
R5 [out gnd] 10k
show out
show step out
time 0 .. 5m, 2000 points`;
lines.push('');
row('(e) step response', 'analyze', '', 'target');
row('    12-part active filter, 2 000 time points', ms(median(() => analyze(fourthOrder), 5, 2)), '', '< 150 ms');
console.log(lines.join('\n'));
