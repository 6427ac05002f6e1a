import { parseSi } from '@rolloff/solver';

/** A frequency as typed: `27k`, `27 kHz`, `1.5M`, `800` (Hz); or what is wrong with it. */
export function readFrequency(text: string): { ok: true; hz: number } | { ok: false; message: string } {
  const trimmed = text.trim();
  if (!trimmed) return { ok: false, message: 'Type a frequency, e.g. 27k or 27 kHz, or click the plot.' };
  const letters = /[A-Za-zµμ]+$/.exec(trimmed)?.[0] ?? '';
  const value = parseSi(trimmed);
  if (value === null || (letters !== '' && !/^[fpnuµμmkMGT]?(Hz)?$/.test(letters))) {
    return { ok: false, message: `“${trimmed}” is not a frequency: write a number of Hz with an optional prefix, e.g. 27k or 27 kHz.` };
  }
  if (!(value > 0) || !Number.isFinite(value)) return { ok: false, message: 'A frequency must be above 0 Hz.' };
  return { ok: true, hz: value };
}
