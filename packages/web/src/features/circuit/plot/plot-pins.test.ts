import { analyze } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { bodeFigure, testTheme } from '../../../test/plot-figures';
import { readPlotPick } from './plot-pins';
import type { PlotPin } from './plot-pins';
import type { Figure } from './figure-style';
import { valueAtFrequency } from './trace-at';

const result = analyze(FIRST_EXAMPLE);
const trace = result.traces[0];
const pin = (overrides: Partial<PlotPin> = {}): PlotPin => ({
  id: 11,
  label: 'P1',
  trace: trace.label,
  frequency: 2500,
  resolved: false,
  note: 'Is <this> corner right?',
  ...overrides,
});
const bodeOf = (pins: PlotPin[], series = [{ result }]): Figure => bodeFigure(series, pins);

describe('pins on the Bode plot', () => {
  it('sit on their trace’s magnitude at their frequency, labelled as in the thread', () => {
    const figure = bodeOf([pin()]);
    const index = figure.targets.findIndex((t) => t?.kind === 'pin');
    expect(figure.targets[index]).toEqual({ kind: 'pin', pinId: 11 });
    const marker = figure.data[index];
    expect(marker.x).toEqual([2500]);
    expect((marker.y as number[])[0]).toBeCloseTo(valueAtFrequency(result.frequencies, trace.magnitudeDb, 2500) ?? NaN, 12);
    expect(marker.marker?.color).toBe(testTheme.pin);
    // The comment is shown on hover as text, never as markup.
    expect(String((marker.hovertext as string[])[0])).toContain('Is &lt;this&gt; corner right?');
    const label = figure.layout.annotations?.find((a) => a.text === 'P1');
    expect(label?.x).toBeCloseTo(Math.log10(2500), 12);
  });

  it('draws a resolved pin hollow, and leaves off pins on other traces or outside the sweep', () => {
    const figure = bodeOf([pin({ id: 1, resolved: true }), pin({ id: 2, trace: 'no such trace' }), pin({ id: 3, frequency: 1e9 })]);
    const pins = figure.targets.filter((t) => t?.kind === 'pin');
    expect(pins).toEqual([{ kind: 'pin', pinId: 1 }]);
    const marker = figure.data[figure.targets.indexOf(pins[0])];
    expect(marker.marker?.color).toBe('rgba(0,0,0,0)');
    expect(marker.marker?.line?.color).toBe(testTheme.pin);
  });
});

describe('a click on the plot', () => {
  const newer = analyze(FIRST_EXAMPLE);
  const older = analyze(FIRST_EXAMPLE.replace('let R  = 10k', 'let R  = 12k'));
  const figure = bodeOf([pin()], [{ result: newer }, { result: older }]);
  const curveOf = (test: (i: number) => boolean) => figure.data.findIndex((_, i) => test(i));
  const magnitude = curveOf((i) => figure.data[i].yaxis === 'y' && figure.data[i].mode === 'lines');
  const phase = curveOf((i) => figure.data[i].yaxis === 'y2' && figure.data[i].mode === 'lines');
  const olderMagnitude = figure.data.findIndex((d, i) => i !== magnitude && d.yaxis === 'y' && d.mode === 'lines');
  const pinCurve = figure.targets.findIndex((t) => t?.kind === 'pin');

  it('reads the frequency of the point on a trace, on the magnitude or the phase panel', () => {
    expect(readPlotPick(figure.targets, [{ curveNumber: magnitude, x: 1234.5 }])).toEqual({ kind: 'frequency', trace: trace.label, frequency: 1234.5 });
    expect(readPlotPick(figure.targets, [{ curveNumber: phase, x: 20_000 }])).toEqual({ kind: 'frequency', trace: trace.label, frequency: 20_000 });
  });

  it('opens a pin rather than making one when a pin is under the pointer', () => {
    expect(
      readPlotPick(figure.targets, [
        { curveNumber: magnitude, x: 2500 },
        { curveNumber: pinCurve, x: 2500 },
      ]),
    ).toEqual({ kind: 'pin', pinId: 11 });
  });

  it('ignores an earlier revision drawn for comparison, and points that are not frequencies', () => {
    expect(olderMagnitude).toBeGreaterThan(-1);
    expect(readPlotPick(figure.targets, [{ curveNumber: olderMagnitude, x: 1000 }])).toBeNull();
    expect(readPlotPick(figure.targets, [{ curveNumber: magnitude, x: 'not a number' }])).toBeNull();
    expect(readPlotPick(figure.targets, [])).toBeNull();
  });
});

describe('valueAtFrequency', () => {
  const frequencies = [10, 100, 1000];
  const values = [0, -20, -40];

  it('is exact on the sweep’s points and linear in log-frequency between them', () => {
    expect(valueAtFrequency(frequencies, values, 100)).toBe(-20);
    expect(valueAtFrequency(frequencies, values, Math.sqrt(10 * 100))).toBeCloseTo(-10, 12);
    expect(valueAtFrequency(frequencies, values, 1000)).toBe(-40);
  });

  it('has no value outside the sweep or across a gap', () => {
    expect(valueAtFrequency(frequencies, values, 5)).toBeNull();
    expect(valueAtFrequency(frequencies, values, 2000)).toBeNull();
    expect(valueAtFrequency(frequencies, [0, Number.NaN, -40], 300)).toBeNull();
  });
});
