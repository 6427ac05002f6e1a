import { formatSi } from '@rolloff/solver';
import type { Readout } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { formatReadout, formatValue, shownReadouts } from './readout-labels';

describe('readouts on screen', () => {
  it('write levels and angles to a hundredth, and other values with SI prefixes', () => {
    expect(formatValue(-0.000086, 'dB')).toBe('0 dB');
    expect(formatValue(-3.0103, 'dB')).toBe('-3.01 dB');
    expect(formatValue(84.3712, 'deg')).toBe('84.37°');
    expect(formatValue(-40.0423, 'dB/decade')).toBe('-40.04 dB/decade');
    expect(formatValue(1000.338, 'Hz')).toBe(formatSi(1000.338, 'Hz'));
    expect(formatValue(Number.POSITIVE_INFINITY, 'dB')).toBe(formatSi(Number.POSITIVE_INFINITY, 'dB'));
  });

  it('add the frequency a readout was found at', () => {
    expect(formatReadout({ trace: 'impedance in', name: 'min-impedance', value: 0.5, unit: 'Ω', at: 12_000 })).toBe(
      `${formatSi(0.5, 'Ω')} at ${formatSi(12_000, 'Hz')}`,
    );
  });

  it('leave out the peak of a flat passband, but keep a real one', () => {
    const flat: Readout[] = [
      { trace: 'out', name: 'peak', value: 0.000008, unit: 'dB', at: null },
      { trace: 'out', name: 'peak-frequency', value: 37, unit: 'Hz', at: null },
      { trace: 'out', name: 'corner', value: 1000, unit: 'Hz', at: null },
    ];
    expect(shownReadouts(flat).map((r) => r.name)).toEqual(['corner']);
    const peaking = [{ ...flat[0], value: 3.2 }, flat[1], flat[2]];
    expect(shownReadouts(peaking).map((r) => r.name)).toEqual(['peak', 'peak-frequency', 'corner']);
  });
});
