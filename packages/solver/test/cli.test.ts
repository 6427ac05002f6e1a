/** The `rolloff` command line, run from source with tsx as a separate process. */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { beforeAll, describe, expect, it } from 'vitest';

const packageDir = fileURLToPath(new URL('..', import.meta.url));
let dir = '';

function rolloff(args: string[], input?: string): { code: number | null; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, ['--import', 'tsx', 'src/cli.ts', ...args], { cwd: packageDir, input, encoding: 'utf8' });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

function file(name: string, text: string): string {
  const p = join(dir, name);
  writeFileSync(p, text);
  return p;
}

const GOOD = `drive in
R1 [in out] 2.2k
C1 [in2 gnd] 1n
R2 [in in2] 1k
C2 [out gnd] 470n
show out
show "zin" impedance in2
sweep 0 .. 1k, 5 linear
require out gain <= 0.1 dB over 0 .. 1k
`;

beforeAll(() => {
  dir = mkdtempSync(join(tmpdir(), 'rolloff-cli-'));
});

describe('rolloff CLI', { timeout: 60_000 }, () => {
  it('solve prints readouts and requirement results and exits 0 when everything passes', () => {
    const r = rolloff(['solve', file('good.cell', GOOD)]);
    expect(r.code).toBe(0);
    // Readouts by their screen names, requirement results in the screens' words.
    expect(r.stdout).toMatch(/^ {2}corner {2,}\d/m);
    expect(r.stdout).toMatch(/^ {2}low-frequency gain {2}/m);
    expect(r.stdout).not.toContain('low-frequency-gain');
    expect(r.stdout).toMatch(/^ {2}pass {2}line 9: /m);
  });

  it('--json prints one object of the contract: plain arrays, non-finite numbers as null', () => {
    const r = rolloff(['solve', file('good.cell', GOOD), '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(Object.keys(j).sort()).toEqual(['diagnostics', 'envelope', 'frequencies', 'poles', 'readouts', 'requirements', 'steps', 'traces', 'zeros']);
    expect(j.frequencies).toEqual([0, 250, 500, 750, 1000]);
    const zin = j.traces.find((t: { label: string }) => t.label === 'zin');
    expect(zin.kind).toBe('impedance');
    for (const key of ['re', 'im', 'magnitude', 'magnitudeDb', 'phaseDeg', 'groupDelay']) expect(Array.isArray(zin[key])).toBe(true);
    // At 0 Hz the shunt capacitor is open and the drive shorts the other end: |Z| is 1 kΩ.
    expect(zin.magnitude[0]).toBeCloseTo(1000, 9);
    const out = j.traces.find((t: { label: string }) => t.label === 'out');
    expect(out.magnitudeDb[0]).toBeCloseTo(0, 12);
    expect(j.requirements[0]).toMatchObject({
      line: 9,
      status: 'pass',
      trace: 'out',
      measure: 'gain',
      op: '<=',
      limit: 0.1,
      tolerance: null,
      band: { low: null, high: 0.1 },
      over: { from: 0, to: 1000 },
      at: null,
      unit: 'dB',
      worstAt: expect.any(Number),
    });
    // JSON keeps the stable ids.
    expect(j.readouts.map((x: { name: string }) => x.name)).toContain('low-frequency-gain');
    expect(j.readouts.every((x: { at: unknown }) => x.at === null || typeof x.at === 'number')).toBe(true);
  });

  it('--json writes a −∞ dB null as null', () => {
    const r = rolloff(['solve', '-', '--json'], 'drive in\nC1 [in out] 1u\nR1 [out gnd] 1k\nshow out\nsweep 0 .. 100, 2 linear\n');
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.traces[0].magnitudeDb[0]).toBeNull();
    expect(j.traces[0].magnitude[0]).toBe(0);
  });

  it("--csv prints one row per frequency, headed in the screens' words: gain and phase, and magnitude for impedances", () => {
    const r = rolloff(['solve', file('good.cell', GOOD), '--csv']);
    expect(r.code).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe(
      'frequency (Hz),out · gain (dB),out · phase (°),out · group delay (s),zin · magnitude (dBΩ),zin · phase (°),zin · group delay (s),zin · magnitude (Ω)',
    );
    expect(lines).toHaveLength(6);
    expect(lines[1].split(',')[0]).toBe('0');
    // The group delay of R·C = 2.2 kΩ · 470 nF at 0 Hz is RC = 1.034 ms [RC1-a, GD: τ(0) = RC].
    expect(Number(lines[1].split(',')[3])).toBeCloseTo(1.034e-3, 12);
    const hp = rolloff(['solve', '-', '--csv'], 'drive in\nC1 [in out] 1u\nR1 [out gnd] 1k\nshow out\nsweep 0 .. 100, 2 linear\n');
    // −∞ dB, an undefined phase and its delay are left empty.
    expect(hp.stdout.trim().split('\n')[1]).toBe('0,,,');
  });

  it('--json writes an infinite readout or measured value as "Infinity", apart from null (no value)', () => {
    // One real pole: the phase never reaches −180°, so the gain margin is +∞ [OA-PM1].
    const r = rolloff(
      ['solve', '-', '--json'],
      'drive in\nA1 [a gnd in gnd] vgain 10k\nR1 [a b] 1k\nC1 [b gnd] (1/(2*pi*10*1k))\nshow loop b\nrequire loop b gain-margin >= 10 dB\n',
    );
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.readouts.find((x: { name: string }) => x.name === 'gain-margin')).toMatchObject({ value: 'Infinity', at: null });
    expect(j.requirements[0]).toMatchObject({ status: 'pass', measured: 'Infinity', reason: null });
  });

  it('a reader that closes the pipe early (`| head`) ends the output quietly, without a crash', () => {
    const cell = file('long.cell', 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out\nsweep 1 .. 1G, 2000/decade\n');
    const r = spawnSync('bash', ['-c', `set -o pipefail; "${process.execPath}" --import tsx src/cli.ts solve "${cell}" --csv | head -n 2`], {
      cwd: packageDir,
      encoding: 'utf8',
    });
    expect(r.stdout.trim().split('\n')).toHaveLength(2);
    expect(r.stderr).toBe('');
    expect(r.status).toBe(0);
  });

  it('--trace LABEL keeps one trace; an unknown label is a bad argument (3)', () => {
    const r = rolloff(['solve', file('good.cell', GOOD), '--csv', '--trace', 'zin']);
    expect(r.stdout.split('\n')[0]).toBe('frequency (Hz),zin · magnitude (dBΩ),zin · phase (°),zin · group delay (s),zin · magnitude (Ω)');
    const bad = rolloff(['solve', file('good.cell', GOOD), '--trace', 'nope']);
    expect(bad.code).toBe(3);
    expect(bad.stderr).toContain('"zin"');
  });

  it('check exits 1 when a requirement fails and prints the result', () => {
    const r = rolloff(['check', file('fail.cell', GOOD.replace('<= 0.1 dB', '<= -1 dB'))]);
    expect(r.code).toBe(1);
    expect(r.stdout).toMatch(/^fail {2}line 9: require out gain <= -1 dB over 0 \.\. 1k/);
  });

  it('errors in the cell exit 2, each on stderr as FILE:LINE:COL: error: MESSAGE', () => {
    const p = file('bad.cell', 'drive in\nR1 [in out] 1meg\nQ1 [a b] 1k\nshow out\n');
    const r = rolloff(['check', p]);
    expect(r.code).toBe(2);
    const errors = r.stderr.split('\n').filter((l) => l.includes(': error: '));
    expect(errors.length).toBeGreaterThanOrEqual(2);
    for (const e of errors) expect(e).toMatch(new RegExp(`^${p.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}:\\d+:\\d+: error: .+`));
    expect(errors[0]).toMatch(/:2:\d+: error: /);
    const stdin = rolloff(['solve', '-'], 'R1 [a b]\n');
    expect(stdin.code).toBe(2);
    expect(stdin.stderr).toMatch(/^<stdin>:1:\d+: error: /m);
  });

  it('a caution is printed as info with its advice, and changes no exit status', () => {
    const r = rolloff(['check', '-'], 'drive in 230\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out\n');
    expect(r.code).toBe(0);
    expect(r.stderr).toMatch(/^<stdin>:1:1: info: this cell looks like a circuit at mains or another hazardous voltage: its drive is 230 V/m);
    expect(r.stderr).toMatch(/^<stdin>:1:1: note: .*licensed practice/m);
  });

  it('bad arguments and unreadable input exit 3', () => {
    expect(rolloff([]).code).toBe(3);
    expect(rolloff(['simulate', 'x.cell']).code).toBe(3);
    expect(rolloff(['solve']).code).toBe(3);
    expect(rolloff(['solve', file('good.cell', GOOD), '--json', '--csv']).code).toBe(3);
    expect(rolloff(['solve', file('good.cell', GOOD), '--frobnicate']).code).toBe(3);
    const missing = rolloff(['solve', join(dir, 'no-such.cell')]);
    expect(missing.code).toBe(3);
    expect(missing.stderr).toContain('cannot read');
  });
});
