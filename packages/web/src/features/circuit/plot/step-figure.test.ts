import { analyze } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { testTheme } from '../../../test/plot-figures';
import { figureCsv } from './figure-csv';
import { figuresFor } from './result-figures';
import { finiteOrNull } from './figure-style';

const CELL = `drive in 2
R1 [in out] 1k
C1 [out gnd] 1u
show out
show step out
time 0 .. 5m, 6 points
`;

describe('the step figure of a result', () => {
  const result = analyze(CELL);
  const figure = figuresFor([{ result }], testTheme).find((f) => f.kind === 'step');

  it('draws each step trace the solver computed, value against time, with its unit', () => {
    expect(figure).toBeDefined();
    const [curve] = figure!.data;
    const step = result.steps[0];
    expect(curve.x).toEqual(finiteOrNull(step.times));
    expect(curve.y).toEqual(finiteOrNull(step.values));
    // An RC step of 2 V: 2·(1 − e^(−t/RC)) [textbook first-order step].
    expect(step.values[1]).toBeCloseTo(2 * (1 - Math.exp(-1)), 6);
    expect(figure!.layout.yaxis?.title).toEqual({ text: 'step response (V)' });
    expect(String((curve.customdata as unknown[][])[1][1])).toContain('V');
  });

  it('downloads as CSV with one row per time', () => {
    const rows = figureCsv(figure!).trim().split(/\r?\n/);
    expect(rows.length).toBe(7);
    expect(rows[0]).toContain('time (s)');
  });

  it('is the only figure of a cell that shows nothing in frequency', () => {
    const only = analyze('drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow step out\n');
    expect(figuresFor([{ result: only }], testTheme).map((f) => f.kind)).toContain('step');
  });

  it('draws each variant’s step traces of a cell with a vary line, named by their value', () => {
    const varied = analyze(`let R = 1k\n${CELL.replace('R1 [in out] 1k', 'R1 [in out] R')}vary R over 1k, 10k\n`);
    const steps = figuresFor([{ result: varied }], testTheme).find((f) => f.kind === 'step')!;
    expect(steps.data.map((d) => d.name)).toEqual(['step out · R = 1k', 'step out · R = 10k']);
    expect(steps.data.map((d) => d.y)).toEqual(varied.variants!.map((v) => finiteOrNull(v.steps[0].values)));
    expect(steps.data[0].line?.color).not.toBe(steps.data[1].line?.color);
  });
});
