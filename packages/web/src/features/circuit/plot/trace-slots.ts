/** The traces a figure draws: each with its series, its variant, its own sweep and its colour. */
import type { NumberArray, Readout, TraceResult } from '@rolloff/solver';
import { variantShade } from './variant-shades';
import { colourOf } from './figure-style';
import type { PlotTheme, PlotSeries } from './figure-style';

export interface TraceSlot {
  series: PlotSeries;
  seriesIndex: number;
  trace: TraceResult;
  colour: string;
  /** The frequencies the trace is drawn over: its result's, or its variant's own. */
  frequencies: NumberArray;
  /** Which variant of a cell with a `vary` line (0 for the first and for a cell without one). */
  variant: number;
  /** The variant's name ("Rload = 10 Ω"), or null without variants. */
  variantLabel: string | null;
  readouts: Readout[];
}

/**
 * Traces of the kinds a figure draws, with a colour per label shared across series; the
 * variants of a cell each get a shade of their trace's colour.
 */
export function slotsOf(series: PlotSeries[], kinds: (kind: TraceResult['kind']) => boolean, theme: PlotTheme): TraceSlot[] {
  const colours = new Map<string, string>();
  const slots: TraceSlot[] = [];
  series.forEach((s, seriesIndex) => {
    const variants = s.result.variants ?? [{ label: null, frequencies: s.result.frequencies, traces: s.result.traces, readouts: s.result.readouts }];
    variants.forEach((v, variant) => {
      for (const trace of v.traces) {
        if (!kinds(trace.kind)) continue;
        if (!colours.has(trace.label)) colours.set(trace.label, colourOf(theme, colours.size));
        const colour = variantShade(colours.get(trace.label) as string, theme.panel, variant, variants.length);
        slots.push({ series: s, seriesIndex, trace, colour, frequencies: v.frequencies, variant, variantLabel: v.label, readouts: v.readouts });
      }
    });
  });
  return slots;
}

/** The first series' slots that carry its markers, margins and pins: those of its first variant. */
export const isPrimary = (slot: TraceSlot) => slot.seriesIndex === 0 && slot.variant === 0;

/** A trace's legend entry: "out", or "out · Rload = 10 Ω" for a variant. */
export const slotLabel = (slot: TraceSlot) => (slot.variantLabel === null ? slot.trace.label : `${slot.trace.label} · ${slot.variantLabel}`);
