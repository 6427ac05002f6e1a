/**
 * Cautions: a cell that looks like a circuit at mains or another hazardous voltage (a
 * voltage drive above the usual extra-low-voltage limit, or words and parts that belong to
 * line-powered circuits) gets one `info` diagnostic with the usual caution. It never blocks
 * the work; screens show it in their caution banner and the command line prints it.
 */
import type { Circuit, SourceRange } from './circuit.js';
import type { Diagnostic } from './result.js';
import { formatSi } from './units.js';
import { diagnostic } from './diagnostic.js';

/** The code of the hazardous-voltage caution. */
export const HAZARDOUS_VOLTAGE = 'hazardous-voltage';

/** AC amplitude above which a voltage drive counts as hazardous (the usual extra-low-voltage limit). */
export const HAZARDOUS_DRIVE_VOLTS = 50;

/** Words of line-powered circuits; safety classes only in comments, where `X1` is no designator. */
const MAINS_WORDS: ReadonlyArray<{ pattern: RegExp; reason: string; commentOnly?: boolean }> = [
  { pattern: /\bmains\b/i, reason: 'it mentions mains' },
  { pattern: /\b(live|neutral)\b/i, reason: 'it names live or neutral conductors' },
  { pattern: /\b(?:X1|X2|X3|Y1|Y2|Y3|Y4)\b/, reason: 'it mentions safety-rated (X/Y) capacitors', commentOnly: true },
  { pattern: /\b(?:100|110|115|120|127|220|230|240|277|400|480)\s*V(?:AC|ac)?\b/, reason: 'it mentions a line voltage' },
  { pattern: /\b(?:line|power)[- ]?(?:filter|input|supply)\b/i, reason: 'it describes a line-powered input' },
];

const ADVICE =
  'such circuits can give a lethal shock, and capacitors can hold their charge after the supply is removed: ' +
  'use safety-rated X and Y capacitors where a part sits across or to the line, give every stored charge a discharge path, ' +
  "and follow your local electrical codes and licensed practice; Rolloff's results do not replace them";

/**
 * The caution of a cell's text, placed at the first thing that suggests a hazardous voltage;
 * empty when nothing does. The drive is read from the elaborated network, so a drive
 * written as a parameter counts too; without a network only the words are read.
 */
export function cautions(text: string, circuit: Circuit | null): Diagnostic[] {
  const found: { reason: string; range: SourceRange }[] = [];
  const add = (reason: string, range: SourceRange) => {
    if (!found.some((f) => f.reason === reason)) found.push({ reason, range });
  };
  const drive = circuit?.drive;
  const hazardousDrive = drive && drive.kind === 'voltage' && Math.abs(drive.amplitude) > HAZARDOUS_DRIVE_VOLTS ? drive : null;
  text.split(/\r\n|\r|\n/).forEach((raw, index) => {
    const line = index + 1;
    const comment = raw.indexOf('#') < 0 ? raw.length : raw.indexOf('#');
    const onDrive = hazardousDrive?.range.line === line;
    if (onDrive) add(`its drive is ${formatSi(Math.abs(hazardousDrive.amplitude), 'V')}, above ${HAZARDOUS_DRIVE_VOLTS} V AC`, hazardousDrive.range);
    for (const { pattern, reason, commentOnly } of MAINS_WORDS) {
      // A drive already named for its voltage needs no second reason for the same number: only its comment is read.
      const from = commentOnly || onDrive ? comment : 0;
      const match = pattern.exec(raw.slice(from));
      if (match) add(reason, { line, column: from + match.index + 1, endColumn: from + match.index + match[0].length + 1 });
    }
  });
  if (found.length === 0) return [];
  const { range } = found[0];
  const message = `this cell looks like a circuit at mains or another hazardous voltage: ${found.map((f) => f.reason).join('; ')}`;
  return [diagnostic(range, HAZARDOUS_VOLTAGE, message, { severity: 'info', hint: ADVICE })];
}
