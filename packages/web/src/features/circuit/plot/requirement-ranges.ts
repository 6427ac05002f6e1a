/**
 * Reads where a requirement applies from its text as written in the cell (`require out gain
 * >= -0.3 dB over 10 .. 500`), so that the plot can shade the region it checks. The solver
 * decides pass or fail; this only places the shading. Bounds written as parameters or
 * expressions cannot be placed and are left open.
 */
import { parseSi } from '@rolloff/solver';
import { tokenizeCellLine } from '../editor/cell-language';
import type { CellToken } from '../editor/cell-language';
import { isUnitText, unitSpellings } from '../editor/cell-words';

export interface RequirementRange {
  /** The trace as named in the requirement (its label or expression). */
  target: string;
  measure: string;
  op: '>=' | '<=' | '=';
  /** The limit, or the centre of an `=` band; null when written as a name or expression. */
  value: number | null;
  /** For `=`: the half-width of the band in the measure's unit. */
  tolerance: number | null;
  /** Frequencies in Hz; null where the range is open or not a plain number. */
  from: number | null;
  to: number | null;
  at: number | null;
}

const OPS: Record<string, RequirementRange['op']> = { '>=': '>=', '≥': '>=', '<=': '<=', '≤': '<=', '=': '=', '==': '=' };

/** Reads a number token (with an optional leading minus and a unit token after it). */
function readNumber(tokens: CellToken[], index: number): { value: number | null; unit: string | null; next: number } {
  let i = index;
  let sign = 1;
  if (tokens[i]?.style === 'operator' && (tokens[i].text === '-' || tokens[i].text === '−')) {
    sign = -1;
    i += 1;
  }
  const token = tokens[i];
  if (!token || token.style !== 'number') {
    // A name or a parenthesised expression: skip it as one value.
    if (token?.style === 'paren' && token.text === '(') {
      let depth = 0;
      for (; i < tokens.length; i++) {
        if (tokens[i].text === '(') depth++;
        if (tokens[i].text === ')' && --depth === 0) return { value: null, unit: null, next: i + 1 };
      }
      return { value: null, unit: null, next: i };
    }
    return { value: null, unit: null, next: token ? i + 1 : i };
  }
  let unit: string | null = null;
  let text = token.text;
  let next = i + 1;
  if (tokens[next]?.style === 'unit') {
    unit = tokens[next].text;
    // A prefixed unit standing on its own (`1 kHz`) still scales the number.
    if (!(unitSpellings as readonly string[]).includes(unit) && isUnitText(unit)) text += unit[0];
    next += 1;
  }
  const value = parseSi(text);
  return { value: value === null ? null : sign * value, unit, next };
}

/** Parses the text of a `require` line; null when it is not one the plot can place. */
export function parseRequirementRange(text: string): RequirementRange | null {
  const tokens = tokenizeCellLine(text).tokens.filter((t) => t.style !== 'comment');
  if (tokens[0]?.text !== 'require') return null;
  const measureIndex = tokens.findIndex((t) => t.style === 'propertyName');
  if (measureIndex < 2) return null;
  const target = tokens
    .slice(1, measureIndex)
    .map((t) => t.text.replace(/^["“”]|["“”]$/g, ''))
    .join(' ');
  const op = OPS[tokens[measureIndex + 1]?.text ?? ''];
  if (!op) return null;
  const limit = readNumber(tokens, measureIndex + 2);
  let i = limit.next;
  let tolerance: number | null = null;
  if (op === '=' && tokens[i] && ['±', '+/-', '+-'].includes(tokens[i].text)) {
    const tol = readNumber(tokens, i + 1);
    i = tol.next;
    if (tol.value !== null && limit.value !== null) tolerance = tol.unit === '%' ? Math.abs(limit.value) * (tol.value / 100) : tol.value;
  }
  const range: RequirementRange = { target, measure: tokens[measureIndex].text, op, value: limit.value, tolerance, from: null, to: null, at: null };
  const word = tokens[i]?.text;
  if (word === 'over') {
    const from = readNumber(tokens, i + 1);
    range.from = from.value;
    i = from.next;
    if (tokens[i] && (tokens[i].text === '..' || tokens[i].text === '…')) {
      const to = readNumber(tokens, i + 1);
      range.to = tokens[i + 1] ? to.value : null;
    }
  } else if (word === 'at') {
    range.at = readNumber(tokens, i + 1).value;
  }
  return range;
}
