import { describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { HAZARDOUS_DRIVE_VOLTS, hazardReasons } from './hazard';

describe('hazard reasons', () => {
  it('finds none in a signal-level cell', () => {
    expect(hazardReasons(FIRST_EXAMPLE)).toEqual([]);
    expect(hazardReasons('drive in 10\nR1 [in out] 1k')).toEqual([]);
  });

  it(`flags a drive above ${HAZARDOUS_DRIVE_VOLTS} V, with or without the unit`, () => {
    expect(hazardReasons('drive in 230V')).toEqual(['its drive is 230 V, above 50 V AC']);
    expect(hazardReasons('drive [l n] 325 V phase 0')).toEqual(['its drive is 325 V, above 50 V AC']);
    expect(hazardReasons('drive in 51')).toHaveLength(1);
    expect(hazardReasons('drive in 50')).toEqual([]);
  });

  it('does not read a current drive as a voltage', () => {
    expect(hazardReasons('drive current [a gnd] 100')).toEqual([]);
  });

  it('flags words and parts that belong to line-powered circuits', () => {
    expect(hazardReasons('# EMI filter at the mains inlet\nC1 [live neutral] 100n')).toEqual(
      expect.arrayContaining(['it mentions mains', 'it names live or neutral conductors']),
    );
    expect(hazardReasons('C3 [a b] 2.2n  # Y2 safety capacitor')).toEqual(['it mentions safety-rated (X/Y) capacitors']);
  });
});
