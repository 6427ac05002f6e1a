/** Number formatting shared by diagnostics and the command line's text output. */

const PREFIXES: [number, string][] = [
  [1e12, 'T'],
  [1e9, 'G'],
  [1e6, 'M'],
  [1e3, 'k'],
  [1, ''],
  [1e-3, 'm'],
  [1e-6, 'µ'],
  [1e-9, 'n'],
  [1e-12, 'p'],
  [1e-15, 'f'],
];

/** `value` with an SI prefix and `digits` significant digits: 1.59155 kHz, 0 Hz, 22.5 µs. */
export function formatQuantity(value: number, unit: string, digits = 6): string {
  if (Number.isNaN(value)) return `NaN${unit ? ' ' + unit : ''}`;
  if (!Number.isFinite(value)) return `${value > 0 ? '∞' : '−∞'}${unit ? ' ' + unit : ''}`;
  if (value === 0) return `0${unit ? ' ' + unit : ''}`;
  const a = Math.abs(value);
  let scale = 1;
  let prefix = '';
  for (const [s, p] of PREFIXES) {
    if (a >= s * (1 - 1e-12)) {
      scale = s;
      prefix = p;
      break;
    }
    scale = s;
    prefix = p;
  }
  const text = trimNumber((value / scale).toPrecision(digits));
  return unit || prefix ? `${text} ${prefix}${unit}` : text;
}

/** A plain number with `digits` significant digits and no trailing zeros. */
export function formatNumber(value: number, digits = 6): string {
  if (Number.isNaN(value)) return 'NaN';
  if (!Number.isFinite(value)) return value > 0 ? '∞' : '−∞';
  const a = Math.abs(value);
  if (a !== 0 && (a >= 1e9 || a < 1e-4)) return value.toExponential(digits - 1).replace(/\.?0+e/, 'e');
  return trimNumber(value.toPrecision(digits));
}

function trimNumber(s: string): string {
  if (s.includes('e')) return s;
  return s.includes('.') ? s.replace(/\.?0+$/, '') : s;
}

/** "0 Hz, 1 kHz and 3 more" — a short list of frequencies for a message. */
export function formatFrequencyList(freqs: readonly number[], shown = 5): string {
  const parts = freqs.slice(0, shown).map((f) => formatQuantity(f, 'Hz'));
  const rest = freqs.length - parts.length;
  if (rest > 0) return `${parts.join(', ')} and ${rest} more`;
  if (parts.length <= 1) return parts.join('');
  return `${parts.slice(0, -1).join(', ')} and ${parts[parts.length - 1]}`;
}
