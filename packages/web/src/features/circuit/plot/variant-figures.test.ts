import { analyze } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { bodeFigure, shapesOf, testTheme } from '../../../test/plot-figures';
import { finiteOrNull } from './figure-style';
import { variantShade } from './variant-shades';

/** An RC low-pass varied over three loads; corners 3.18 kHz, 1.75 kHz and 1.61 kHz. */
const CELL = `let Rload = 1kΩ
drive in
R1 [in out] 1k
C1 [out gnd] 100n
R2 [out gnd] Rload
show out
show "in" in
vary Rload over 1k, 10k, 100k
require out corner >= 1.7k`;

describe('the Bode figure of a cell with variants', () => {
  const result = analyze(CELL);
  const figure = bodeFigure([{ result }]);
  const magnitudes = figure.data.filter((d) => d.mode === 'lines' && d.yaxis === 'y');

  it('draws every variant’s traces, each named by its trace and its value in the legend', () => {
    expect(magnitudes.map((d) => d.name)).toEqual([
      'out · Rload = 1 kΩ',
      'in · Rload = 1 kΩ',
      'out · Rload = 10 kΩ',
      'in · Rload = 10 kΩ',
      'out · Rload = 100 kΩ',
      'in · Rload = 100 kΩ',
    ]);
    const variants = result.variants ?? [];
    expect(magnitudes[2].x).toEqual(finiteOrNull(variants[1].frequencies));
    expect(magnitudes[2].y).toEqual(finiteOrNull(variants[1].traces[0].magnitudeDb));
  });

  it('gives a trace’s variants shades of its colour, the first the colour itself', () => {
    const colours = magnitudes.map((d) => d.line?.color);
    const [out, input] = testTheme.traces;
    expect(colours).toEqual([
      out,
      input,
      variantShade(out, testTheme.panel, 1, 3),
      variantShade(input, testTheme.panel, 1, 3),
      variantShade(out, testTheme.panel, 2, 3),
      variantShade(input, testTheme.panel, 2, 3),
    ]);
    expect(new Set(colours).size).toBe(6);
  });

  it('marks each variant’s corner in its shade, leaving the values to the readouts table', () => {
    for (const [i, v] of (result.variants ?? []).entries()) {
      const corner = v.readouts.find((r) => r.trace === 'out' && r.name === 'corner');
      const line = shapesOf(figure).find((s) => s.type === 'line' && s.x0 === corner?.value);
      expect(line?.line?.color).toBe(variantShade(testTheme.traces[0], testTheme.panel, i, 3));
    }
    expect(figure.layout.annotations?.filter((a) => String(a.text).startsWith('corner'))).toEqual([]);
  });

  it('shades the requirement by its result over every variant, and only the first variant can be pinned', () => {
    expect(result.requirements[0].status).toBe('fail');
    const band = shapesOf(figure).find((s) => s.type === 'rect' && s.yref === 'y domain');
    expect(band?.fillcolor).toBe(testTheme.fail);
    const pinnable = figure.targets.filter((t) => t !== null);
    // The first variant's two traces, magnitude and phase each.
    expect(pinnable).toHaveLength(4);
  });
});

describe('variant shades', () => {
  it('mix the colour towards the panel in even steps, the last 60 % of the way', () => {
    expect(variantShade('#000000', '#ffffff', 0, 4)).toBe('#000000');
    // 0.6 × 255 = 153 = 0x99; the steps between are 0.2 and 0.4 of the way (51, 102).
    expect([1, 2, 3].map((i) => variantShade('#000000', '#ffffff', i, 4))).toEqual(['#333333', '#666666', '#999999']);
    expect(variantShade('#fff', '#000', 1, 2)).toBe('#666666');
  });

  it('leave a colour that is not written in hex as it is, and a single variant in its colour', () => {
    expect(variantShade('rgb(1, 2, 3)', '#ffffff', 1, 3)).toBe('rgb(1, 2, 3)');
    expect(variantShade('#123456', '#ffffff', 0, 1)).toBe('#123456');
  });
});
