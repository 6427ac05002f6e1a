/**
 * SI and IEC 60062 number forms, and readout formatting. Reference values: the SI prefixes
 * table of the SI Brochure (9th ed.) and the R/k/M letter code of IEC 60062.
 */
import { describe, expect, it } from 'vitest';
import { formatFrequencyList, formatReading, formatSi, parseSi, parseSiWithUnit } from '../src/units.js';

describe('parseSi', () => {
  it.each([
    ['12', 12],
    ['0.47', 0.47],
    ['.5', 0.5],
    ['1e-9', 1e-9],
    ['2E3', 2000],
    ['4.7k', 4700],
    ['10M', 10e6],
    ['10m', 10e-3],
    ['100f', 100e-15],
    ['22p', 22e-12],
    ['3n', 3e-9],
    ['1u', 1e-6],
    ['1µ', 1e-6],
    ['1μ', 1e-6],
    ['3G', 3e9],
    ['1T', 1e12],
    // IEC 60062: the letter is the decimal point.
    ['4k7', 4700],
    ['2n2', 2.2e-9],
    ['4R7', 4.7],
    ['0R1', 0.1],
    ['1M5', 1.5e6],
    ['10R', 10],
    // With units, attached or apart.
    ['10nF', 10e-9],
    ['4k7Ω', 4700],
    ['1 kHz', 1000],
    ['4.7 kΩ', 4700],
    ['-3 dB', -3],
    ['45°', 45],
    ['2%', 2],
    ['1mS', 1e-3],
    ['2.2 ohm', 2.2],
  ])('%s is %d', (text, value) => {
    expect(parseSi(text)).toBeCloseTo(value, 20);
    expect(Math.abs((parseSi(text) as number) - value)).toBeLessThanOrEqual(Math.abs(value) * 1e-15);
  });

  it.each(['', 'k', 'abc', '10meg', '10MEG', '1KHz', '1 khz', '4k7k', '10x', '1 2'])('%j is not a number', (text) => {
    expect(parseSi(text)).toBeNull();
  });

  it('reports the unit that was written', () => {
    expect(parseSiWithUnit('10 nF')).toEqual({ value: 10e-9, unit: 'F' });
    expect(parseSiWithUnit('27°C')).toEqual({ value: 27, unit: '°C' });
    expect(parseSiWithUnit('2.2 ohm')).toEqual({ value: 2.2, unit: 'Ω' });
    expect(parseSiWithUnit('4k7')).toEqual({ value: 4700, unit: null });
  });
});

describe('formatSi', () => {
  it.each([
    [4700, 'Ω', undefined, '4.7 kΩ'],
    [1000.2, 'Hz', undefined, '1 kHz'],
    [1000.2, 'Hz', 6, '1.0002 kHz'],
    [999.96, 'Hz', undefined, '1 kHz'],
    [999.94, 'Hz', undefined, '999.9 Hz'],
    [-3.0103, 'dB', undefined, '-3.01 dB'],
    [45.25, 'deg', undefined, '45.25°'],
    [2.5, '%', undefined, '2.5%'],
    [22.5e-9, 'F', undefined, '22.5 nF'],
    [1e-6, 'F', undefined, '1 µF'],
    [0.02, 'Ω', undefined, '20 mΩ'],
    [1.5e-18, 'F', undefined, '0.0015 fF'],
    [2e15, 'Hz', undefined, '2000 THz'],
    [0.70710678, '', undefined, '0.7071'],
    [4700, '', undefined, '4.7k'],
    [1e-5, '', undefined, '10µ'],
    [0, 'V', undefined, '0 V'],
    [300.15, 'K', 5, '300.15 K'],
    [Number.NaN, 'dB', undefined, 'NaN dB'],
    [Number.POSITIVE_INFINITY, 'Ω', undefined, '∞ Ω'],
    [Number.NEGATIVE_INFINITY, 'dB', undefined, '-∞ dB'],
  ])('%d %s (%s digits) is %s', (value, unit, digits, text) => {
    expect(formatSi(value, unit, digits)).toBe(text);
  });
});

describe('formatReading and formatFrequencyList', () => {
  it('write levels and angles to a hundredth and everything else as formatSi does', () => {
    expect(formatReading(-0.000086, 'dB')).toBe('0 dB');
    expect(formatReading(-3.0103, 'dB')).toBe('-3.01 dB');
    expect(formatReading(84.3712, 'deg')).toBe('84.37°');
    expect(formatReading(-40.0423, 'dB/decade')).toBe('-40.04 dB/decade');
    expect(formatReading(1000.338, 'Hz')).toBe(formatSi(1000.338, 'Hz'));
    expect(formatReading(Number.NEGATIVE_INFINITY, 'dB')).toBe('-∞ dB');
  });

  it('list at most five frequencies and count the rest', () => {
    expect(formatFrequencyList([0])).toBe('0 Hz');
    expect(formatFrequencyList([0, 1000])).toBe('0 Hz and 1 kHz');
    expect(formatFrequencyList([1, 2, 3, 4, 5, 6, 7])).toBe('1 Hz, 2 Hz, 3 Hz, 4 Hz, 5 Hz and 2 more');
  });
});

describe('the foundation checks', () => {
  it('reads SI prefixes, with m as milli and M as mega (SI Brochure, 9th ed., prefixes table)', () => {
    expect(parseSi('4.7k')).toBeCloseTo(4700, 9);
    expect(parseSi('10m')).toBeCloseTo(0.01, 15);
    expect(parseSi('10M')).toBeCloseTo(1e7, 3);
    expect(parseSi('2.2µ')).toBeCloseTo(2.2e-6, 18);
  });

  it('reads the IEC 60062 letter-as-decimal-point form (IEC 60062 R/k/M code, common practice)', () => {
    expect(parseSi('4k7')).toBeCloseTo(4700, 9);
    expect(parseSi('2n2')).toBeCloseTo(2.2e-9, 20);
    expect(parseSi('4R7')).toBeCloseTo(4.7, 12);
  });

  it('refuses what is not a number of the language', () => {
    expect(parseSi('10meg')).toBeNull();
    expect(parseSi('abc')).toBeNull();
  });

  it('writes readouts with a prefix and unit', () => {
    expect(formatSi(4700, 'Ω')).toBe('4.7 kΩ');
    expect(formatSi(-3.0103, 'dB')).toBe('-3.01 dB');
  });

  it('round-trips through parseSi', () => {
    for (const value of [1e-15, 3.3e-12, 4.7e-9, 0.022, 1, 1500, 2.2e6, 1e12]) {
      const back = parseSi(formatSi(value, '', 6));
      expect(back).not.toBeNull();
      expect(Math.abs((back as number) - value) / value).toBeLessThan(1e-5);
    }
  });
});
