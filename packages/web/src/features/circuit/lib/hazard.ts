/**
 * When a cell suggests mains or another hazardous voltage: a voltage drive over 50 V, or
 * words and parts that belong to line-powered circuits (mains, live/neutral, safety-rated
 * X/Y capacitors). The screen then shows the usual caution; it never blocks the work.
 */
import { parseSi } from '@rolloff/solver';

/** AC amplitude above which a drive counts as hazardous (the usual extra-low-voltage limit). */
export const HAZARDOUS_DRIVE_VOLTS = 50;

const MAINS_WORDS: ReadonlyArray<{ pattern: RegExp; reason: string }> = [
  { pattern: /\bmains\b/i, reason: 'it mentions mains' },
  { pattern: /\b(live|neutral)\b/i, reason: 'it names live or neutral conductors' },
  { pattern: /\b(?:X1|X2|X3|Y1|Y2|Y3|Y4)\b/, reason: 'it mentions safety-rated (X/Y) capacitors' },
  { pattern: /\b(?:100|110|115|120|127|220|230|240|277|400|480)\s*V(?:AC|ac)?\b/, reason: 'it mentions a line voltage' },
  { pattern: /\b(?:line|power)[- ]?(?:filter|input|supply)\b/i, reason: 'it describes a line-powered input' },
];

/** Why a cell's text suggests a hazardous voltage; empty when it does not. */
export function hazardReasons(text: string): string[] {
  const reasons = new Set<string>();
  for (const raw of text.split(/\r\n|\r|\n/)) {
    const code = raw.replace(/#.*/, '').trim();
    const words = code.split(/\s+/);
    let hazardousDrive = false;
    if (words[0] === 'drive' && words[1] !== 'current') {
      const amplitude = driveAmplitude(words.slice(1));
      hazardousDrive = amplitude !== null && Math.abs(amplitude) > HAZARDOUS_DRIVE_VOLTS;
      if (hazardousDrive) reasons.add(`its drive is ${amplitude} V, above ${HAZARDOUS_DRIVE_VOLTS} V AC`);
    }
    // A drive already named for its voltage needs no second reason for the same number.
    const text = hazardousDrive ? raw.replace(/^[^#]*/, '') : raw;
    for (const { pattern, reason } of MAINS_WORDS) if (pattern.test(text)) reasons.add(reason);
  }
  return [...reasons];
}

/** The amplitude of `drive NODE AMP` or `drive [p n] AMP`, when written as a plain number. */
function driveAmplitude(words: string[]): number | null {
  let i = 0;
  if (words[0]?.startsWith('[')) {
    while (i < words.length && !words[i].endsWith(']')) i++;
    i++;
  } else {
    i = 1;
  }
  const amplitude = words[i];
  if (amplitude === undefined || amplitude === 'phase') return null;
  // `230V` and `230 V` are both read; a unit other than V is not a voltage.
  const unit = words[i + 1] === 'V' ? 'V' : '';
  const value = parseSi(amplitude + unit);
  if (value === null) return null;
  return /[A-Za-z]$/.test(amplitude) && !/V$/.test(amplitude) && !/[fpnuµmkMGT]$/.test(amplitude) ? null : value;
}
