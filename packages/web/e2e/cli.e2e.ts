/**
 * The README's promise for the command line: after `npm start` or `npm test` on a fresh
 * clone, `npx rolloff solve FILE --json` works from the repository's root.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';

const repositoryRoot = fileURLToPath(new URL('../../..', import.meta.url));

describe('the rolloff command from the repository root', () => {
  it('solves a cell file and prints JSON', () => {
    const file = path.join(mkdtempSync(path.join(os.tmpdir(), 'rolloff-cli-')), 'rc.rolloff');
    writeFileSync(file, 'drive in\nR1 [in out] 1k\nC1 [out gnd] 1u\nshow out\nsweep at 0, 159.155, 1k\n');
    const run = spawnSync('npx', ['--no-install', 'rolloff', 'solve', file, '--json'], { cwd: repositoryRoot, encoding: 'utf8' });
    expect(run.stderr).not.toMatch(/error/i);
    expect(run.status).toBe(0);
    const result = JSON.parse(run.stdout) as { frequencies: number[]; traces: { label: string; magnitudeDb: (number | null)[] }[] };
    expect(result.frequencies).toEqual([0, 159.155, 1000]);
    // An RC low-pass is 0 dB at DC and −3.01 dB at f = 1/(2πRC) = 159.155 Hz (a first-order pole, common practice).
    expect(result.traces[0].magnitudeDb[0]).toBeCloseTo(0, 9);
    expect(result.traces[0].magnitudeDb[1]).toBeCloseTo(-3.0103, 3);
  });
});
