/** Step traces in the command line's JSON, CSV and text, and the library's output functions. */
import { spawnSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { toJson, toStepCsv, toText } from '../src/output.js';

const packageDir = fileURLToPath(new URL('..', import.meta.url));

const CELL = `drive in
R1 [in out] 1k
C1 [out gnd] 1u
show out
show step out
show "charge" step current C1
time 0 .. 8m, 5 points
require step out value >= 0.98 at 4m
`;

describe('step traces in the outputs', () => {
  it('JSON carries steps as {label, expr, unit, times, values} in plain arrays [textbook RC step: 1 − e^(−t/RC)]', () => {
    const j = JSON.parse(toJson(analyze(CELL)));
    expect(j.steps.map((s: { label: string }) => s.label)).toEqual(['step out', 'charge']);
    const [v, i] = j.steps;
    expect(v).toMatchObject({ label: 'step out', expr: 'out', unit: 'V' });
    expect(i).toMatchObject({ expr: 'current C1', unit: 'A' });
    expect(v.times).toEqual([0, 2e-3, 4e-3, 6e-3, 8e-3]);
    expect(v.values[2]).toBeCloseTo(1 - Math.exp(-4), 7);
    // The capacitor's current is the resistor's: (1 − V)/R.
    expect(i.values[1]).toBeCloseTo(Math.exp(-2) / 1e3, 10);
    expect(j.readouts.filter((x: { trace: string }) => x.trace === 'step out').map((x: { name: string }) => x.name)).toEqual([
      'final',
      't63',
      'rise-time',
      'settling',
      'overshoot',
    ]);
  });

  it('CSV of the step traces: one row per time, a column per trace with its unit', () => {
    const csv = toStepCsv(analyze(CELL)).trim().split('\n');
    expect(csv[0]).toBe('time (s),step out (V),charge (A)');
    expect(csv.length).toBe(6);
    expect(Number(csv[5].split(',')[0])).toBe(8e-3);
    expect(toStepCsv(analyze(CELL), { trace: 'charge' }).split('\n')[0]).toBe('time (s),charge (A)');
  });

  it('text names the step trace, its window and its readouts', () => {
    const text = toText(analyze(CELL));
    expect(text).toMatch(/^step out {2}\(step, V, 0 s \.\. 8 ms, 5 points\)$/m);
    expect(text).toMatch(/^ {2}t63 +1(\.0+)? ms$/m);
  });

  it('the command line prints the step table with --csv --time, and refuses --time alone', { timeout: 60_000 }, () => {
    const cli = (args: string[]) => spawnSync(process.execPath, ['--import', 'tsx', 'src/cli.ts', ...args], { cwd: packageDir, input: CELL, encoding: 'utf8' });
    const ok = cli(['solve', '-', '--csv', '--time']);
    expect(ok.status).toBe(0);
    expect(ok.stdout.split('\n')[0]).toBe('time (s),step out (V),charge (A)');
    const traced = cli(['solve', '-', '--json', '--trace', 'charge']);
    expect(JSON.parse(traced.stdout).steps.map((s: { label: string }) => s.label)).toEqual(['charge']);
    const bad = cli(['solve', '-', '--time']);
    expect(bad.status).toBe(3);
    expect(bad.stderr).toContain('use it with --csv');
  });
});
