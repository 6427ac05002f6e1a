import { describe, expect, it } from 'vitest';
import { readFrequency } from './frequency';

describe('readFrequency', () => {
  it('reads a number of Hz with an SI prefix, with or without the unit', () => {
    expect(readFrequency('27k')).toEqual({ ok: true, hz: 27_000 });
    expect(readFrequency(' 27.54 kHz ')).toEqual({ ok: true, hz: 27_540 });
    expect(readFrequency('1.5M')).toEqual({ ok: true, hz: 1_500_000 });
    expect(readFrequency('800')).toEqual({ ok: true, hz: 800 });
  });

  it('says what is wrong with anything else', () => {
    expect(readFrequency('')).toMatchObject({ ok: false, message: expect.stringContaining('Type a frequency') });
    expect(readFrequency('3 dB')).toMatchObject({ ok: false, message: expect.stringContaining('“3 dB” is not a frequency') });
    expect(readFrequency('fast')).toMatchObject({ ok: false });
    expect(readFrequency('0')).toEqual({ ok: false, message: 'A frequency must be above 0 Hz.' });
  });
});
