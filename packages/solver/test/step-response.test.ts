/**
 * `show step`: the time response, checked where a hand formula is exact and where it is not.
 * Each expected value names its source beside it.
 */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import type { Result, StepResult } from '../src/result.js';
import { readout, rel, run } from './helpers/cell.js';

function step(result: Result, label: string): StepResult {
  const s = result.steps.find((x) => x.label === label);
  if (!s) throw new Error(`no step trace ${label}; have ${result.steps.map((x) => x.label).join(', ')}`);
  return s;
}

/** The largest relative error of a step trace against f, over the points where f is not 0. */
function worstError(s: StepResult, f: (t: number) => number): number {
  let worst = 0;
  for (let k = 0; k < s.times.length; k++) {
    const exact = f(s.times[k]);
    if (exact === 0) continue;
    worst = Math.max(worst, Math.abs(s.values[k] - exact) / Math.abs(exact));
  }
  return worst;
}

describe('RC charging', () => {
  const tau = 1e-3;
  const cell = `
drive in 2
R1 [in out] 1k
C1 [out gnd] 1u
show step out
time 0 .. 10m, 501 points
`;

  it('follows V·(1 − e^(−t/RC)) to 1e-6 [textbook first-order step, V(t) = V·(1 − e^(−t/τ))]', () => {
    const r = run(cell);
    const s = step(r, 'step out');
    expect(s.expr).toBe('out');
    expect(s.unit).toBe('V');
    expect(s.times.length).toBe(501);
    expect(s.times[0]).toBe(0);
    expect(s.times[500]).toBeCloseTo(10e-3, 15);
    expect(worstError(s, (t) => 2 * (1 - Math.exp(-t / tau)))).toBeLessThan(1e-6);
    // At rest before the step, and the capacitor holds its 0 V across the step.
    expect(Math.abs(s.values[0])).toBeLessThan(1e-9);
  });

  it('answers no "not available" warning for show step and time', () => {
    const r = run(cell);
    expect(r.diagnostics.filter((d) => d.code === 'not-available')).toEqual([]);
  });

  it('takes its label and is named step EXPR without one', () => {
    const r = run(cell.replace('show step out', 'show "charge" step out'));
    expect(r.steps.map((s) => s.label)).toEqual(['charge']);
  });

  it('defaults to about ten time constants [the module’s own rule: 10 × the slowest time constant]', () => {
    const r = run('drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow step out\n');
    const s = step(r, 'step out');
    expect(rel(s.times[s.times.length - 1], 10 * tau)).toBeLessThan(1e-6);
    expect(s.times.length).toBe(1001);
  });

  it('reads 63.2 % at τ and 99.3 % at 5τ [textbook: 1 − e^(−1) = 0.632121, 1 − e^(−5) = 0.993262]', () => {
    const r = run('drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow step out\ntime 0 .. 5m, 6 points\n');
    const s = step(r, 'step out');
    expect(s.values[1]).toBeCloseTo(0.632121, 6);
    expect(s.values[5]).toBeCloseTo(0.993262, 6);
  });

  it('turns over with a negative amplitude [common practice: the response scales with the step]', () => {
    const r = run(cell.replace('drive in 2', 'drive in -2'));
    expect(worstError(step(r, 'step out'), (t) => -2 * (1 - Math.exp(-t / tau)))).toBeLessThan(1e-6);
  });

  it('starts from the value just after the step where a node follows the drive at once [common practice: a divider has no memory]', () => {
    const r = run('drive in\nR1 [in out] 1k\nR2 [out gnd] 3k\nC1 [in gnd] 1u\nR3 [in x] 1k\nC2 [x gnd] 1u\nshow step out\ntime 0 .. 1m\n');
    const s = step(r, 'step out');
    for (let k = 0; k < s.times.length; k++) expect(s.values[k]).toBeCloseTo(0.75, 12);
  });
});

describe('a capacitor charged by a current with no DC path', () => {
  it('ramps as V = I·t/C, with no singular complaint [textbook: i = C·dv/dt with i constant]', () => {
    const r = analyze('drive current out 2m\nC1 [out gnd] 1u\nshow step out\ntime 0 .. 1m\n');
    expect(r.diagnostics.filter((d) => d.severity !== 'info')).toEqual([]);
    const s = step(r, 'step out');
    expect(s.unit).toBe('V');
    expect(worstError(s, (t) => (2e-3 * t) / 1e-6)).toBeLessThan(1e-6);
  });

  it('has no final value, and says so once on the trace line', () => {
    const r = analyze('drive current out 2m\nC1 [out gnd] 1u\nshow step out\ntime 0 .. 1m\n');
    expect(r.readouts.filter((x) => x.trace === 'step out')).toEqual([]);
    const notes = r.diagnostics.filter((d) => d.code === 'step-readouts');
    expect(notes.length).toBe(1);
    expect(notes[0].line).toBe(3);
    expect(notes[0].hint).toContain('no final value');
  });

  it('without a time line, shows a window and says that the network has no time constant', () => {
    const r = analyze('drive current out 2m\nC1 [out gnd] 1u\nshow step out\n');
    expect(r.diagnostics.some((d) => d.code === 'no-time-constant' && d.severity === 'info')).toBe(true);
    const s = step(r, 'step out');
    expect(s.times[s.times.length - 1]).toBeGreaterThan(0);
    expect(worstError(s, (t) => (2e-3 * t) / 1e-6)).toBeLessThan(1e-6);
  });
});

describe('a stiff network whose time constants span six decades', () => {
  // Two RC sections on one drive: τ = 1 s and τ = 1 µs.
  const cell = `
drive in
R1 [in a] 1k
C1 [a gnd] 1m
R2 [in d] 1k
C2 [d gnd] 1n
show step a
show step d
`;
  const slow = (t: number): number => 1 - Math.exp(-t / 1); // textbook first-order step
  const fast = (t: number): number => 1 - Math.exp(-t / 1e-6); // textbook first-order step

  it('is stable and accurate at the slow end over the default window [textbook first-order step]', () => {
    const r = run(cell);
    const a = step(r, 'step a');
    expect(rel(a.times[a.times.length - 1], 10)).toBeLessThan(1e-6);
    expect(worstError(a, slow)).toBeLessThan(1e-6);
    expect(worstError(step(r, 'step d'), fast)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'step a', 't63').value, 1)).toBeLessThan(1e-6);
  });

  it('is accurate at the fast end in a window of microseconds [textbook first-order step]', () => {
    const r = run(cell + 'time 0 .. 10u\n');
    expect(worstError(step(r, 'step d'), fast)).toBeLessThan(1e-6);
    expect(worstError(step(r, 'step a'), slow)).toBeLessThan(1e-6);
  });

  it('measures the fast edge between two points of the slow window [textbook: t63 = τ, settling = τ·ln 100]', () => {
    const r = run(cell);
    expect(rel(readout(r, 'step d', 't63').value, 1e-6)).toBeLessThan(1e-6);
    expect(rel(readout(r, 'step d', 'settling').value, 1e-6 * Math.log(100))).toBeLessThan(1e-5);
    expect(readout(r, 'step d', 'overshoot').value).toBe(0);
  });
});

describe('a series RLC, underdamped', () => {
  // R = 100 Ω, L = 10 mH, C = 1 µF: ωn = 1/√(LC) = 10⁴ rad/s, ζ = (R/2)·√(C/L) = 0.5.
  const zeta = 0.5;
  const wn = 1e4;
  const wd = wn * Math.sqrt(1 - zeta * zeta);
  const cell = 'drive in\nR1 [in a] 100\nL1 [a b] 10m\nC1 [b gnd] 1u\nshow step b\n';

  it('follows the second-order step to 1e-6 of its final value [textbook: y = 1 − e^(−ζωn·t)·(cos ωd·t + ζ/√(1−ζ²)·sin ωd·t)]', () => {
    const s = step(run(cell + 'time 0 .. 2m, 801 points\n'), 'step b');
    const exact = (t: number): number => 1 - Math.exp(-zeta * wn * t) * (Math.cos(wd * t) + (zeta / Math.sqrt(1 - zeta * zeta)) * Math.sin(wd * t));
    for (let k = 0; k < s.times.length; k++) expect(Math.abs(s.values[k] - exact(s.times[k]))).toBeLessThan(1e-6);
  });

  it('overshoots by exp(−πζ/√(1−ζ²)) = 16.3034 % [textbook second-order step overshoot]', () => {
    const r = run(cell);
    const expected = 100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta));
    expect(rel(readout(r, 'step b', 'overshoot').value, expected)).toBeLessThan(1e-6);
    expect(readout(r, 'step b', 'overshoot').unit).toBe('%');
    expect(rel(readout(r, 'step b', 'final').value, 1)).toBeLessThan(1e-12);
  });
});

describe('an op-amp with its gain–bandwidth pole', () => {
  it('a follower steps as one pole at GBW·(1 + 1/G) [from A(s) = G/(1 + s·G/ωt): H = A/(1 + A), a first-order step]', () => {
    const G = 1e5;
    const wt = 2 * Math.PI * 1e6;
    const r = run('drive in\nU1 [in out out] opamp gain 100dB gbw 1M\nshow step out\n');
    const s = step(r, 'step out');
    const k = G / (1 + G);
    const rate = (wt * (1 + G)) / G;
    expect(worstError(s, (t) => k * (1 - Math.exp(-rate * t)))).toBeLessThan(1e-6);
    expect(rel(readout(r, 'step out', 't63').value, 1 / rate)).toBeLessThan(1e-6);
    expect(rel(s.times[s.times.length - 1], 10 / rate)).toBeLessThan(1e-6);
  });

  it('a second pole adds the overshoot of a second-order loop [textbook: ωt·p2 loop, ζ = ½·√(p2/ωt)]', () => {
    // A(s) = ωt/(s·(1 + s/p2)) around unity feedback: s² + p2·s + ωt·p2, so ωn = √(ωt·p2), ζ = p2/(2ωn).
    const wt = 2 * Math.PI * 1e6;
    const p2 = 2 * Math.PI * 1e6;
    const zeta = p2 / (2 * Math.sqrt(wt * p2));
    const r = run('drive in\nU1 [in out out] opamp gbw 1M pole2 1M\nshow step out\n');
    const expected = 100 * Math.exp((-Math.PI * zeta) / Math.sqrt(1 - zeta * zeta));
    expect(rel(readout(r, 'step out', 'overshoot').value, expected)).toBeLessThan(1e-6);
  });
});

describe('coupled inductors', () => {
  it('follow the two-mesh solution [textbook coupled meshes, K·i′ = u − R·i, solved with Sylvester’s formula for e^(At)]', () => {
    const [L1, L2, k, R1, R2] = [1e-3, 1e-3, 0.98, 50, 1e3];
    const M = k * Math.sqrt(L1 * L2);
    const r = run(
      `drive in\nR1 [in p] 50\nL1 [p gnd] 1m\nL2 [s gnd] 1m\ncouple L1 L2 0.98\nR2 [s gnd] 1k\nshow step s\nshow step current L1\ntime 0 .. 200u, 401 points\n`,
    );
    // A = −K⁻¹·R with K = [[L1, M], [M, L2]], R = diag(R1, R2); x∞ = (1/R1, 0); x(t) = x∞ − e^(At)·x∞.
    const det = L1 * L2 - M * M;
    const a = [
      [(-L2 * R1) / det, (M * R2) / det],
      [(M * R1) / det, (-L1 * R2) / det],
    ];
    const tr = a[0][0] + a[1][1];
    const dt = a[0][0] * a[1][1] - a[0][1] * a[1][0];
    const l1 = tr / 2 + Math.sqrt((tr * tr) / 4 - dt);
    const l2 = tr / 2 - Math.sqrt((tr * tr) / 4 - dt);
    const x = (t: number): number[] => {
      const e1 = Math.exp(l1 * t);
      const e2 = Math.exp(l2 * t);
      const m = (i: number, j: number): number => (e1 * (a[i][j] - (i === j ? l2 : 0)) - e2 * (a[i][j] - (i === j ? l1 : 0))) / (l1 - l2);
      const xi = 1 / R1;
      return [xi - m(0, 0) * xi, -m(1, 0) * xi];
    };
    const i1 = step(r, 'step current L1');
    const vs = step(r, 'step s');
    expect(i1.unit).toBe('A');
    for (let q = 0; q < i1.times.length; q++) {
      const [c1, c2] = x(i1.times[q]);
      expect(Math.abs(i1.values[q] - c1)).toBeLessThan(1e-6 / R1);
      expect(Math.abs(vs.values[q] - -R2 * c2)).toBeLessThan(1e-6);
    }
  });
});
