/** The hazardous-voltage caution: one threshold and one wording, carried as an `info` diagnostic. */
import { describe, expect, it } from 'vitest';
import { analyze } from '../src/analyze.js';
import { HAZARDOUS_DRIVE_VOLTS, HAZARDOUS_VOLTAGE } from '../src/cautions.js';
import { compile } from '../src/compile.js';
import { FIRST_EXAMPLE } from '../src/examples.js';
import type { Diagnostic } from '../src/result.js';

const NETWORK = 'R1 [in out] 1k\nC1 [out gnd] 1u\nshow out\nsweep 10 .. 1k\n';

function cautionsOf(text: string): Diagnostic[] {
  return analyze(text).diagnostics.filter((d) => d.code === HAZARDOUS_VOLTAGE);
}

/** The reasons a caution gives, after its fixed opening. */
function reasons(text: string): string[] {
  const found = cautionsOf(text);
  expect(found.length).toBeLessThanOrEqual(1);
  return found.length === 0 ? [] : found[0].message.replace(/^[^:]*: /, '').split('; ');
}

describe('the hazardous-voltage caution', () => {
  it('is absent from a signal-level cell', () => {
    expect(cautionsOf(FIRST_EXAMPLE)).toEqual([]);
    expect(cautionsOf(`drive in 10\n${NETWORK}`)).toEqual([]);
  });

  it(`flags a voltage drive above ${HAZARDOUS_DRIVE_VOLTS} V, with or without the unit, and not one at it`, () => {
    expect(reasons(`drive in 230V\n${NETWORK}`)).toEqual(['its drive is 230 V, above 50 V AC']);
    expect(reasons(`drive [in gnd] 325 V phase 0\n${NETWORK}`)).toEqual(['its drive is 325 V, above 50 V AC']);
    expect(reasons(`drive in 51\n${NETWORK}`)).toHaveLength(1);
    expect(reasons(`drive in 50\n${NETWORK}`)).toEqual([]);
  });

  it('reads the drive as the network has it, so a parameter counts too', () => {
    expect(reasons(`let Vline = 230\ndrive in Vline\n${NETWORK}`)).toEqual(['its drive is 230 V, above 50 V AC']);
  });

  it('does not read a current drive as a voltage', () => {
    expect(cautionsOf('drive current [a gnd] 100\nR1 [a gnd] 1k\nshow impedance a\n')).toEqual([]);
  });

  it('flags words and parts that belong to line-powered circuits, in comments too', () => {
    expect(reasons(`# EMI filter at the mains inlet\ndrive in\nC1 [in out] 100n\nR1 [out gnd] 1k\nshow out  # across live and neutral\n`)).toEqual([
      'it mentions mains',
      'it names live or neutral conductors',
    ]);
    expect(reasons(`drive in\nC3 [in out] 2.2n  # Y2 safety capacitor\nR1 [out gnd] 1k\nshow out\n`)).toEqual(['it mentions safety-rated (X/Y) capacitors']);
  });

  it('is one info diagnostic at the first thing that suggests it, with the usual advice, and fails nothing', () => {
    const text = `drive in 230 V  # straight off the mains\n${NETWORK}require out gain <= 0.1 dB over 10 .. 1k\n`;
    const result = analyze(text);
    const [caution] = cautionsOf(text);
    expect(caution).toMatchObject({ severity: 'info', line: 1, column: 1 });
    expect(caution.message).toBe('this cell looks like a circuit at mains or another hazardous voltage: its drive is 230 V, above 50 V AC; it mentions mains');
    expect(caution.hint).toContain('local electrical codes and licensed practice');
    expect(result.requirements.map((q) => q.status)).toEqual(['pass']);
    expect(result.traces).toHaveLength(1);
  });

  it('comes with compile too, and words still count while the cell has errors', () => {
    expect(compile(`drive in 230\n${NETWORK}`).diagnostics.filter((d) => d.code === HAZARDOUS_VOLTAGE)).toHaveLength(1);
    expect(reasons('# mains filter\nR1 [a b\n')).toEqual(['it mentions mains']);
  });
});
