/**
 * SI prefixes and units: reading numbers as the cell language writes them (`4.7k`, `4k7`,
 * `2n2`, `4R7`, `10nF`, `1 kHz`) and writing them back for readouts (`4.7 kΩ`).
 */

import { SI_PREFIXES, UNIT_SPELLINGS, UNPREFIXED_UNITS } from './vocabulary.js';
import type { Unit } from './vocabulary.js';

/** Units that never take an SI prefix. */
const UNPREFIXED: ReadonlySet<Unit> = new Set<Unit>(UNPREFIXED_UNITS);

/** What the text after a number's digits turned out to be. */
export type SuffixReading = { kind: 'ok'; multiplier: number; unit: Unit | null; prefix: string | null } | { kind: 'bad'; reason: SuffixProblem };

export type SuffixProblem =
  | { kind: 'mega'; spelling: string; replacement: string }
  | { kind: 'capital-prefix'; letter: string; replacement: string }
  | { kind: 'unit-case'; spelling: string; replacement: string | null; hint?: string }
  | { kind: 'prefixed-unit'; prefix: string; unit: string }
  | { kind: 'unknown'; spelling: string };

/** Misspelt units with their one sure correction (null: ambiguous, hint only). */
const UNIT_MISSPELLINGS: Readonly<Record<string, string | null>> = {
  hz: 'Hz',
  HZ: 'Hz',
  hZ: 'Hz',
  db: 'dB',
  DB: 'dB',
  Db: 'dB',
  ohms: 'ohm',
  Ohm: 'ohm',
  Ohms: 'ohm',
  OHM: 'ohm',
  f: null,
  sec: 's',
  degree: 'deg',
  degrees: 'deg',
};

/**
 * Reads the letters after a number's digits: an optional SI prefix, then an optional unit.
 * `meg`, a capital `K`/`U` used as a prefix and miscased units are recognised so that the
 * caller can say exactly what is wrong.
 */
export function readSuffix(suffix: string): SuffixReading {
  if (suffix === '') return { kind: 'ok', multiplier: 1, unit: null, prefix: null };
  const whole = UNIT_SPELLINGS[suffix];
  if (whole !== undefined) return { kind: 'ok', multiplier: 1, unit: whole, prefix: null };
  const mega = /^(meg|MEG|Meg|mEG|MEg)(.*)$/.exec(suffix);
  if (mega) {
    return { kind: 'bad', reason: { kind: 'mega', spelling: mega[1], replacement: 'M' + mega[2] } };
  }
  const first = suffix[0];
  const rest = suffix.slice(1);
  const multiplier = SI_PREFIXES[first];
  if (multiplier !== undefined) {
    if (rest === '') return { kind: 'ok', multiplier, unit: null, prefix: first };
    const unit = UNIT_SPELLINGS[rest];
    if (unit !== undefined) {
      if (UNPREFIXED.has(unit)) return { kind: 'bad', reason: { kind: 'prefixed-unit', prefix: first, unit: rest } };
      return { kind: 'ok', multiplier, unit, prefix: first };
    }
    if (rest === 'hz' || rest === 'HZ') {
      // `mhz` could be milli- or megahertz; `khz` can only be kilohertz.
      if (first === 'm' || first === 'M') {
        return { kind: 'bad', reason: { kind: 'unit-case', spelling: suffix, replacement: null, hint: 'write mHz for millihertz or MHz for megahertz' } };
      }
      return { kind: 'bad', reason: { kind: 'unit-case', spelling: suffix, replacement: first + 'Hz' } };
    }
    if (rest === 'f' || rest === 'h') {
      // `nf` is nano-femto as written; farads and henries are capital F and H.
      const unit = rest.toUpperCase();
      if (first === 'm') {
        const name = unit === 'F' ? 'farads' : 'henries';
        return {
          kind: 'bad',
          reason: {
            kind: 'unit-case',
            spelling: suffix,
            replacement: null,
            hint: `${name} are ${unit}: write m${unit} for milli${name}, or u${unit} if micro was meant`,
          },
        };
      }
      return { kind: 'bad', reason: { kind: 'unit-case', spelling: suffix, replacement: first + unit } };
    }
    const mis = UNIT_MISSPELLINGS[rest];
    if (mis !== undefined && mis !== null) {
      return { kind: 'bad', reason: { kind: 'unit-case', spelling: suffix, replacement: first + mis } };
    }
  }
  if ((first === 'U' || first === 'N' || first === 'P') && (rest === '' || UNIT_SPELLINGS[rest] !== undefined)) {
    const lower = first.toLowerCase();
    return { kind: 'bad', reason: { kind: 'capital-prefix', letter: first, replacement: lower + rest } };
  }
  if (first === 'K' && UNIT_SPELLINGS[rest] !== undefined) {
    return { kind: 'bad', reason: { kind: 'capital-prefix', letter: 'K', replacement: 'k' + rest } };
  }
  const mis = UNIT_MISSPELLINGS[suffix];
  if (mis !== undefined) return { kind: 'bad', reason: { kind: 'unit-case', spelling: suffix, replacement: mis } };
  return { kind: 'bad', reason: { kind: 'unknown', spelling: suffix } };
}

const NUMBER_RE = /^([+-]?)(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?/;
const IEC_RE = /^([+-]?)(\d+)([fpnuµμmkMGTR])(\d+)/;
const SUFFIX_RE = /^[A-Za-zµμΩ°%]*/;

/**
 * Reads a number as the cell language writes it, with an optional SI prefix and unit:
 * `4.7k`, `4k7`, `2n2`, `4R7`, `10nF`, `1 kHz`, `1e-9`, `-3 dB`, `4.7 kΩ`. Returns the
 * value (the prefix applied, the unit dropped) or null when the text is not such a number.
 */
export function parseSi(text: string): number | null {
  const read = parseSiWithUnit(text);
  return read === null ? null : read.value;
}

/** Like `parseSi`, but also returns the unit that was written (canonical spelling). */
export function parseSiWithUnit(text: string): { value: number; unit: Unit | null } | null {
  const t = text.trim();
  const iec = IEC_RE.exec(t);
  let value: number;
  let rest: string;
  if (iec) {
    const sign = iec[1] === '-' ? -1 : 1;
    const scale = iec[3] === 'R' ? 1 : SI_PREFIXES[iec[3]];
    value = sign * Number(`${iec[2]}.${iec[4]}`) * scale;
    rest = t.slice(iec[0].length);
    const unit = SUFFIX_RE.exec(rest)?.[0] ?? '';
    if (unit.length !== rest.length) return null;
    if (unit === '') return { value, unit: null };
    const u = UNIT_SPELLINGS[unit];
    return u === undefined ? null : { value, unit: u };
  }
  const m = NUMBER_RE.exec(t);
  if (!m) return null;
  value = Number(m[0]);
  rest = t.slice(m[0].length).replace(/^\s+/, '');
  const suffix = SUFFIX_RE.exec(rest)?.[0] ?? '';
  if (suffix.length !== rest.length) return null;
  if (suffix === 'R') return { value, unit: null };
  const reading = readSuffix(suffix);
  if (reading.kind === 'bad') return null;
  return { value: value * reading.multiplier, unit: reading.unit };
}

const FORMAT_PREFIXES: ReadonlyArray<readonly [number, string]> = [
  [12, 'T'],
  [9, 'G'],
  [6, 'M'],
  [3, 'k'],
  [0, ''],
  [-3, 'm'],
  [-6, 'µ'],
  [-9, 'n'],
  [-12, 'p'],
  [-15, 'f'],
];

/** Writes a unit after a number: no space before `%` and `°`, one space otherwise. */
function joinUnit(number: string, unit: string): string {
  if (unit === '') return number;
  if (unit === '%' || unit === '°' || unit === 'deg') return number + (unit === 'deg' ? '°' : unit);
  return `${number} ${unit}`;
}

function trimZeros(s: string): string {
  if (!s.includes('.') || s.includes('e')) return s;
  return s.replace(/0+$/, '').replace(/\.$/, '');
}

/**
 * Writes a value with an SI prefix and its unit for a readout: `formatSi(4700, 'Ω')` →
 * `4.7 kΩ`, `formatSi(1000.2, 'Hz')` → `1 kHz`, `formatSi(-3.0103, 'dB')` → `-3.01 dB`.
 * Without a unit, values from 0.001 to 999.9 are written plainly and others as `4.7k`.
 * `digits` is the count of significant digits (default 4); trailing zeros are dropped.
 * dB, %, degrees, K and °C never take a prefix. Non-finite values give `NaN`, `∞`, `-∞`.
 */
export function formatSi(value: number, unit = '', digits = 4): string {
  const d = Math.min(17, Math.max(1, Math.round(digits)));
  if (Number.isNaN(value)) return joinUnit('NaN', unit);
  if (!Number.isFinite(value)) return joinUnit(value > 0 ? '∞' : '-∞', unit);
  const canonical = UNIT_SPELLINGS[unit];
  if (value === 0) return joinUnit('0', unit);
  if (canonical !== undefined && UNPREFIXED.has(canonical)) {
    return joinUnit(trimZeros(plainDigits(value, d)), unit);
  }
  const magnitude = Math.abs(value);
  let exponent = Math.floor(Math.log10(magnitude) / 3) * 3;
  exponent = Math.max(-15, Math.min(12, exponent));
  let scaled = value / 10 ** exponent;
  // Rounding can carry into the next prefix (999.96 → 1000 → 1 k).
  if (Math.abs(Number(scaled.toPrecision(d))) >= 1000 && exponent < 12) {
    exponent += 3;
    scaled = value / 10 ** exponent;
  }
  if (unit === '' && magnitude >= 1e-3 && Math.abs(Number(value.toPrecision(d))) < 1000) {
    // A plain ratio or Q reads better as 0.7071 than as 707.1m.
    return trimZeros(plainDigits(value, d));
  }
  const prefix = FORMAT_PREFIXES.find(([e]) => e === exponent)?.[1] ?? '';
  const number = trimZeros(plainDigits(scaled, d));
  // Without a unit the prefix sits on the number, as the cell language writes it (4.7k).
  if (unit === '') return number + prefix;
  return `${number} ${prefix}${unit}`;
}

/** toPrecision without exponent notation for the magnitudes formatSi produces. */
function plainDigits(value: number, digits: number): string {
  const s = value.toPrecision(digits);
  if (!s.includes('e')) return s;
  const n = Number(s);
  const abs = Math.abs(n);
  if (abs >= 1e-6 && abs < 1e21) {
    const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(abs)));
    return n.toFixed(Math.min(100, decimals));
  }
  return s;
}

/** Levels and angles to a hundredth: finer digits are below anything a bench can see. */
function hundredths(value: number, unit: string): string {
  if (!Number.isFinite(value)) return formatSi(value, unit);
  const rounded = Math.round(value * 100) / 100;
  return formatSi(Object.is(rounded, -0) ? 0 : rounded, unit, 6);
}

/**
 * A readout's or requirement's value as every screen writes it: `1 kHz`, `-3.01 dB`,
 * `-40.04 dB/decade`; levels and angles to a hundredth, everything else by `formatSi`.
 */
export function formatReading(value: number, unit: string): string {
  if (unit === 'dB' || unit === 'deg' || unit === '°') return hundredths(value, unit);
  if (unit.startsWith('dB/')) return `${hundredths(value, 'dB')}${unit.slice(2)}`;
  return formatSi(value, unit);
}

/** "0 Hz, 1 kHz and 3 more" — a short list of frequencies for a message. */
export function formatFrequencyList(freqs: readonly number[], shown = 5): string {
  const parts = freqs.slice(0, shown).map((f) => formatSi(f, 'Hz'));
  const rest = freqs.length - parts.length;
  if (rest > 0) return `${parts.join(', ')} and ${rest} more`;
  if (parts.length <= 1) return parts.join('');
  return `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}
