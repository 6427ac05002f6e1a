/**
 * The measures a sign-off reads off a band or a feature of a trace: the ripple and the
 * delay variation over a band (highest − lowest), the minimum attenuation over a stop band,
 * the insertion loss at one frequency, a notch's depth and frequency, and an impedance's
 * highest peak (its anti-resonance) with its frequency. Every extreme is the true one,
 * refined between sweep points on exact solves (`extremeOver`, `innerExtreme`), so a value
 * does not depend on where the sweep's points fall, nor on where it starts and ends beyond
 * the band asked for. Attenuation and loss are −gain: dB below the drive, positive for a loss.
 */
import type { Measure } from './vocabulary.js';
import type { Shape } from './readouts.js';
import type { TraceView } from './trace-view.js';
import { extremeOver, innerExtreme, measureAt } from './extremes.js';
import type { Extreme } from './extremes.js';
import { formatSi } from './units.js';

export type BandMeasure = Extract<
  Measure,
  'ripple' | 'min-attenuation' | 'insertion-loss' | 'notch-depth' | 'notch-frequency' | 'max-impedance' | 'anti-resonance' | 'delay-variation'
>;

/** What was measured: the value (and where, when it has one place), or why nothing could be. */
export type Measured = { value: number; worstAt: number | null } | { notApplicable: string };

/** Measures in dB of a transfer, which an impedance (in Ω) does not have. */
const TRANSFER_ONLY = new Set<BandMeasure>(['ripple', 'min-attenuation', 'insertion-loss', 'notch-depth', 'notch-frequency']);

/**
 * The measure over [from, to] (from = to = F for `insertion-loss … at F`); `written` says
 * whether the requirement gave that range (else it is the sweep). `level` is the trace's
 * passband level in dB (NaN where it has none) and `shape` what the readouts found.
 */
export function bandMeasure(measure: BandMeasure, view: TraceView, from: number, to: number, written: boolean, level: number, shape: Shape): Measured {
  const label = view.trace.result.label;
  const na = (why: string): Measured => ({ notApplicable: why });
  if (view.trace.result.kind === 'impedance' && TRANSFER_ONLY.has(measure)) {
    return na(`${label} is an impedance, and ${measure} is a measure of a transfer in dB: require its magnitude, min-impedance or max-impedance`);
  }
  if (!(from <= to)) return na('the range of this requirement is empty');
  const range = written ? `${formatSi(from, 'Hz')} .. ${formatSi(to, 'Hz')}` : 'the sweep';
  const singular = (e: Extreme): Measured => na(`${label} has no value at ${formatSi(e.at, 'Hz')}: the network is singular there`);
  switch (measure) {
    case 'ripple':
    case 'delay-variation': {
      const quantity = measure === 'ripple' ? 'gain' : 'delay';
      const high = extremeOver(view, quantity, from, to, 'max') as Extreme;
      const low = extremeOver(view, quantity, from, to, 'min') as Extreme;
      if (Number.isNaN(high.value)) return singular(high);
      if (Number.isNaN(low.value)) return singular(low);
      return { value: high.value - low.value, worstAt: null };
    }
    case 'min-attenuation': {
      const high = extremeOver(view, 'gain', from, to, 'max') as Extreme;
      if (Number.isNaN(high.value)) return singular(high);
      return { value: -high.value, worstAt: high.at };
    }
    case 'insertion-loss': {
      const gain = measureAt(view, 'gain', from);
      if (Number.isNaN(gain)) return singular({ value: gain, at: from });
      return { value: -gain, worstAt: from };
    }
    case 'notch-depth':
    case 'notch-frequency': {
      const dip = innerExtreme(view, 'gain', from, to, 'min');
      if (dip === null) return na(`${label} has no notch in ${range}: its lowest point there is at an end`);
      if (Number.isNaN(dip.value)) return singular(dip);
      if (measure === 'notch-frequency') return { value: dip.at, worstAt: null };
      if (Number.isNaN(level)) {
        const what = view.trace.result.kind === 'loop' ? 'a loop gain' : shape;
        return na(`${label} is ${what}, so it has no passband level to measure the depth of its notch from: require its gain at the notch`);
      }
      return { value: level - dip.value, worstAt: dip.at };
    }
    case 'max-impedance':
    case 'anti-resonance': {
      const peak = innerExtreme(view, 'magnitude', from, to, 'max');
      if (peak === null) return na(`${label} has no peak (anti-resonance) in ${range}: its highest point there is at an end`);
      if (Number.isNaN(peak.value)) return singular(peak);
      return measure === 'max-impedance' ? { value: peak.value, worstAt: peak.at } : { value: peak.at, worstAt: null };
    }
  }
}
