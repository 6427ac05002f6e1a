import { describe, expect, it } from 'vitest';
import { parseRequirementRange } from './requirement-ranges';

describe('where a requirement applies', () => {
  it('reads a limit over a closed range', () => {
    expect(parseRequirementRange('require out gain >= -0.3 dB over 10 .. 500')).toEqual({
      target: 'out',
      measure: 'gain',
      op: '>=',
      value: -0.3,
      tolerance: null,
      from: 10,
      to: 500,
      at: null,
    });
  });

  it('reads an open range and SI prefixes', () => {
    expect(parseRequirementRange('require out gain <= -38 dB over 10k ..')).toMatchObject({ op: '<=', value: -38, from: 10_000, to: null });
  });

  it('turns a relative tolerance into a band in the measure’s unit', () => {
    const range = parseRequirementRange('require out corner = 1k ± 2%');
    expect(range).toMatchObject({ measure: 'corner', op: '=', value: 1000 });
    expect(range?.tolerance).toBeCloseTo(20, 12);
    expect(parseRequirementRange('require out corner = 1k +/- 50 Hz')?.tolerance).toBe(50);
  });

  it('reads a single frequency, a target of two words and a prefixed unit', () => {
    expect(parseRequirementRange('require impedance in magnitude <= 2 at 1 kHz')).toMatchObject({ target: 'impedance in', measure: 'magnitude', value: 2, at: 1000 });
  });

  it('leaves bounds written as names open, and refuses lines that are not requirements', () => {
    expect(parseRequirementRange('require out gain >= -3 dB over f1 .. f2')).toMatchObject({ from: null, to: null, value: -3 });
    expect(parseRequirementRange('show out')).toBeNull();
    expect(parseRequirementRange('require out')).toBeNull();
  });
});
