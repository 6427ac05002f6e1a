import { describe, expect, it } from 'vitest';
import { formatSi, parseSi } from '../src/units.js';

describe('parseSi', () => {
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
});

describe('formatSi', () => {
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
