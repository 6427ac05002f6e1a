/**
 * How pins are named and drawn: "P1", "P2"… in the order they were made (the list comes
 * oldest first, so a pin keeps its name), and the marks a plot needs for one cell revision.
 */
import type { Pin } from '@rolloff/api/contract';

/** Each pin's short name, by id. */
export function pinLabels(pins: readonly Pin[]): Map<number, string> {
  return new Map(pins.map((pin, index) => [pin.id, `P${index + 1}`]));
}

/** The first words of a comment, on one line, for a plot's hover text. */
export function excerptOf(text: string, max = 80): string {
  const line = text.replace(/\s+/g, ' ').trim();
  return line.length > max ? `${line.slice(0, max - 1)}…` : line;
}

/** What a plot draws of a pin (the circuit feature's PlotPin, by shape). */
export interface PinMark {
  id: number;
  label: string;
  trace: string;
  frequency: number;
  resolved: boolean;
  note: string;
}

const NO_MARKS: readonly PinMark[] = [];

/**
 * The marks of every pin, grouped by the cell revision it was made on; `marksOf(cellId,
 * revision)` returns the same array each time, so a plot is not redrawn for nothing.
 */
export function pinMarks(pins: readonly Pin[], labels: ReadonlyMap<number, string>): (cellId: number, revision: number) => readonly PinMark[] {
  const groups = new Map<string, PinMark[]>();
  for (const pin of pins) {
    const key = `${pin.cellId}:${pin.revisionNumber}`;
    const mark: PinMark = {
      id: pin.id,
      label: labels.get(pin.id) ?? '',
      trace: pin.trace,
      frequency: pin.frequency,
      resolved: pin.resolved,
      note: excerptOf(pin.comments[0]?.body ?? ''),
    };
    groups.set(key, [...(groups.get(key) ?? []), mark]);
  }
  return (cellId, revision) => groups.get(`${cellId}:${revision}`) ?? NO_MARKS;
}
