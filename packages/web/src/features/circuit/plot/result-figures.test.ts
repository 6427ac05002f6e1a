import { READOUT_NAMES, STATUS_WORDS, analyze, formatSi } from '@rolloff/solver';
import type { RequirementResult, Result } from '@rolloff/solver';
import { describe, expect, it } from 'vitest';
import { FIRST_EXAMPLE } from '@rolloff/solver';
import { bodeFigure, shapesOf, testTheme } from '../../../test/plot-figures';
import { figureCsv } from './figure-csv';
import { decibelRange, finiteOrNull } from './figure-style';
import { figuresFor } from './result-figures';
import { placeRequirements } from './requirement-marks';
import type { Figure } from './figure-style';

const bodeOf = (result: Result): Figure => bodeFigure([{ result }]);

describe('the Bode figure of a result', () => {
  const result = analyze(FIRST_EXAMPLE);
  const figure = bodeOf(result);
  const trace = result.traces[0];

  it('draws magnitude in dB over phase in degrees on one log-frequency axis', () => {
    const [magnitude, phase] = figure.data;
    expect(magnitude.x).toEqual(finiteOrNull(result.frequencies));
    expect(magnitude.y).toEqual(finiteOrNull(trace.magnitudeDb));
    expect(magnitude.yaxis).toBe('y');
    expect(phase.y).toEqual(finiteOrNull(trace.phaseDeg));
    expect(phase.yaxis).toBe('y2');
    expect(phase.xaxis).toBe(magnitude.xaxis);
    expect(figure.layout.xaxis?.type).toBe('log');
    expect(figure.layout.yaxis?.title).toEqual({ text: 'magnitude (dB)' });
    expect(figure.layout.yaxis2?.title).toEqual({ text: 'phase (°)' });
  });

  it('names each trace in the legend and shows frequency, magnitude and phase on hover', () => {
    const [magnitude, phase] = figure.data;
    expect(magnitude.name).toBe(trace.label);
    expect(magnitude.showlegend).not.toBe(false);
    expect(phase.showlegend).toBe(false);
    const point = (magnitude.customdata as string[][])[10];
    expect(point).toEqual([formatSi(result.frequencies[10], 'Hz'), formatSi(trace.magnitudeDb[10], 'dB'), formatSi(trace.phaseDeg[10], 'deg')]);
    expect(magnitude.hovertemplate).toContain('customdata[2]');
  });

  it('marks the corner at the frequency of the readout, with its value', () => {
    const corner = result.readouts.find((r) => r.trace === trace.label && r.name === 'corner');
    expect(corner).toBeDefined();
    const marker = shapesOf(figure).find((s) => s.type === 'line' && s.x0 === corner?.value && s.x1 === corner?.value);
    expect(marker).toBeDefined();
    const label = figure.layout.annotations?.find((a) => String(a.text).startsWith('corner'));
    expect(label?.text).toBe(`${READOUT_NAMES.corner} ${formatSi(corner?.value ?? NaN, 'Hz')}`);
    // Annotations on a log axis are placed by the logarithm of the value (Plotly's convention).
    expect(label?.x).toBeCloseTo(Math.log10(corner?.value ?? NaN), 12);
  });

  it('shades each requirement range where it is checked, tinted by its result', () => {
    for (const requirement of result.requirements) expect(requirement.status).toBe('pass');
    const rects = shapesOf(figure).filter((s) => s.type === 'rect');
    // require out gain >= -0.3 dB over 10 .. 500: allowed from the limit upwards over 10 Hz to 500 Hz.
    const passband = rects.find((s) => s.x0 === 10 && s.x1 === 500);
    expect(passband).toMatchObject({ yref: 'y', y0: -0.3, fillcolor: testTheme.pass });
    // require out gain <= -38 dB over 10k ..: open to the end of the sweep.
    const stopband = rects.find((s) => s.x0 === 10_000);
    expect(stopband).toMatchObject({ yref: 'y', y1: -38, x1: result.frequencies[result.frequencies.length - 1], fillcolor: testTheme.pass });
    // require out corner = 1k ± 2%: the frequencies between 980 Hz and 1.02 kHz, full height.
    const corner = rects.find((s) => s.yref === 'y domain');
    expect(corner?.x0).toBeCloseTo(980, 9);
    expect(corner?.x1).toBeCloseTo(1020, 9);
  });

  it('tints a failing requirement with the fail colour and marks its worst point', () => {
    const failing = analyze(FIRST_EXAMPLE.replace('require out gain >= -0.3 dB over 10 .. 500', 'require out gain >= -0.1 dB over 10 .. 700'));
    const requirement = failing.requirements.find((r) => r.text.includes('-0.1 dB'));
    expect(requirement?.status).toBe('fail');
    const figureOfFailing = bodeOf(failing);
    const rect = shapesOf(figureOfFailing).find((s) => s.type === 'rect' && s.x0 === 10 && s.x1 === 700);
    expect(rect?.fillcolor).toBe(testTheme.fail);
    const worst = figureOfFailing.data.find((d) => d.mode === 'markers' && (d.x as number[])[0] === requirement?.worstAt);
    expect((worst?.y as number[])[0]).toBe(requirement?.measured);
    expect(String(worst?.hovertemplate)).toMatch(new RegExp(`^${STATUS_WORDS.fail}: require out gain &gt;= -0.1 dB`));
  });

  it('places each requirement on the trace whose label it carries', () => {
    expect(placeRequirements(result).map((p) => p.trace.label)).toEqual(result.requirements.map((q) => q.trace));
    expect(placeRequirements(result).map((p) => p.trace)).toEqual(result.requirements.map(() => trace));
  });
});

describe('requirements drawn from the fields the solver carries', () => {
  it('shades a range and a limit written as parameters like literals', () => {
    const written = FIRST_EXAMPLE.replace('let R  = 10k', 'let R  = 10k\nlet fpass = 500\nlet floor = -38')
      .replace('over 10 .. 500', 'over 10 .. fpass')
      .replace('<= -38 dB over 10k ..', '<= floor over (fpass*20) ..');
    const result = analyze(written);
    expect(result.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const rects = shapesOf(bodeOf(result)).filter((s) => s.type === 'rect' && s.yref === 'y');
    expect(rects.find((s) => s.x0 === 10 && s.x1 === 500)).toMatchObject({ y0: -0.3, fillcolor: testTheme.pass });
    expect(rects.find((s) => s.x0 === 10_000)).toMatchObject({ y1: -38, fillcolor: testTheme.pass });
  });

  /** The first example's result with its `=` requirement replaced by `changes`; its text is left unreadable on purpose. */
  function withCorner(changes: Partial<RequirementResult>): Result {
    const result = analyze(FIRST_EXAMPLE);
    const requirements = result.requirements.map((q) => (q.measure === 'corner' ? { ...q, text: 'not a requirement the web could read', ...changes } : q));
    return { ...result, requirements };
  }

  it('draws an `=` band exactly as carried, not re-derived from limit and tolerance', () => {
    const rect = shapesOf(bodeOf(withCorner({ limit: 1000, tolerance: { relative: 0.02 }, band: { low: 900, high: 1300 } }))).find(
      (s) => s.yref === 'y domain',
    );
    expect(rect).toMatchObject({ x0: 900, x1: 1300, fillcolor: testTheme.pass });
  });

  it('draws a band’s closed sides as limit lines, and tints by the status carried', () => {
    const result = withCorner({
      measure: 'gain',
      op: '=',
      limit: -1,
      tolerance: { absolute: 0.1 },
      band: { low: -2, high: 0.5 },
      over: { from: 20, to: 200 },
      unit: 'dB',
      status: 'fail',
    });
    const shapes = shapesOf(bodeOf(result)).filter((s) => s.yref === 'y' && s.x0 === 20 && s.x1 === 200);
    expect(shapes.find((s) => s.type === 'rect')).toMatchObject({ y0: -2, y1: 0.5, fillcolor: testTheme.fail });
    expect(shapes.filter((s) => s.type === 'line').map((s) => s.y0)).toEqual([-2, 0.5]);
  });

  it('draws nothing for a requirement that could not be checked', () => {
    const result = withCorner({ status: 'not-applicable', measured: Number.NaN });
    expect(shapesOf(bodeOf(result)).some((s) => s.yref === 'y domain' && s.type === 'rect')).toBe(false);
  });
});

describe('other figures', () => {
  it('draws an impedance trace in Ω on log axes, not in dB', () => {
    const result = analyze('drive in\nR1 [in out] 100\nC1 [out gnd] 1u\nshow impedance in\nsweep 10 .. 100k\n');
    expect(result.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    const figures = figuresFor([{ result }], testTheme);
    expect(figures.map((f) => f.kind)).toEqual(['impedance']);
    const [magnitude] = figures[0].data;
    expect(magnitude.y).toEqual(finiteOrNull(result.traces[0].magnitude));
    expect(figures[0].layout.yaxis?.type).toBe('log');
    expect(figures[0].layout.xaxis?.type).toBe('log');
    expect(String((figures[0].layout.yaxis?.title as { text: string }).text)).toContain('Ω');
  });

  it('overlays two revisions with one colour per trace, the older one dashed', () => {
    const newer = analyze(FIRST_EXAMPLE);
    const older = analyze(FIRST_EXAMPLE.replace('let R  = 10k', 'let R  = 12k'));
    const figure = figuresFor(
      [
        { result: newer, name: 'revision 2' },
        { result: older, name: 'revision 1', dash: 'dash' },
      ],
      testTheme,
    ).find((f) => f.kind === 'bode');
    const lines = (figure?.data ?? []).filter((d) => d.mode === 'lines' && d.yaxis === 'y');
    expect(lines.map((d) => d.name)).toEqual(['revision 2 · out', 'revision 1 · out']);
    expect(lines[0].line?.color).toBe(lines[1].line?.color);
    expect(lines[1].line?.dash).toBe('dash');
    expect(lines[1].y).toEqual(finiteOrNull(older.traces[0].magnitudeDb));
  });

  it('passes labels and series names to Plotly as text, never as the HTML Plotly reads in them', () => {
    const result = analyze(FIRST_EXAMPLE);
    const link = '<a href="x">click</a>';
    const relabel = (label: string) => (label === result.traces[0].label ? link : label);
    const labelled: Result = {
      ...result,
      traces: result.traces.map((t) => ({ ...t, label: relabel(t.label) })),
      readouts: result.readouts.map((r) => ({ ...r, trace: relabel(r.trace) })),
    };
    const figure = bodeFigure([{ result: labelled, name: 'R&D <b>2</b>' }]);
    const [magnitude] = figure.data;
    // Plotly shows the entities &lt; &gt; &amp; as the characters < > &.
    expect(magnitude.name).toBe('R&amp;D &lt;b&gt;2&lt;/b&gt; · &lt;a href="x"&gt;click&lt;/a&gt;');
    // Nothing Plotly shows holds the markup: legend names, hover texts, annotations.
    const shown = figuresFor([{ result: labelled, name: 'R&D <b>2</b>' }], testTheme).flatMap((f) => [
      ...f.data.flatMap((d) => [d.name, d.hovertemplate, d.hovertext, d.text].flat()),
      ...(f.layout.annotations ?? []).map((a) => a.text),
    ]);
    expect(shown.filter((text) => typeof text === 'string' && /<a |<b>/.test(text))).toEqual([]);
    // The CSV is not HTML: it carries the label as the cell wrote it.
    expect(figureCsv(figure).split('\r\n')[0]).toContain(`R&D <b>2</b> · ${link}`.replace(/"/g, '""'));
  });

  it('draws nothing for a cell whose text has errors', () => {
    const result = analyze('R1 [a b');
    expect(figuresFor([{ result }], testTheme)).toEqual([]);
  });
});

describe('decibelRange', () => {
  it('rounds out to whole tens and keeps the limits in view', () => {
    expect(decibelRange([[-0.5, -60]], [])).toEqual([-70, 10]);
    expect(decibelRange([[-0.5, -20]], [-38])).toEqual([-50, 10]);
  });

  it('never goes deeper than 200 dB below the top, so an exact null does not flatten the plot', () => {
    expect(decibelRange([[0, -1e6, Number.NEGATIVE_INFINITY]], [])).toEqual([-190, 10]);
  });
});

describe('the sign-off measures drawn from their fields', () => {
  const BRIDGED_T = 'drive in\nC1 [in m] 10n\nC2 [m out] 10n\nR1 [in out] 100k\nR2 [m gnd] 1k\nshow out\n';

  it('draws a loss on the gain axis turned over: min-attenuation ≥ 30 dB is gain ≤ −30 dB over its band, its worst point at −measured', () => {
    const result = analyze(`${BRIDGED_T}require out min-attenuation >= 30 dB over 1.5k .. 1.7k\nrequire out insertion-loss <= 1 dB at 100`);
    const [attenuation, loss] = result.requirements;
    const figure = bodeOf(result);
    const rects = shapesOf(figure).filter((s) => s.type === 'rect' && s.yref === 'y');
    expect(rects.find((s) => s.x0 === 1500 && s.x1 === 1700)).toMatchObject({ y1: -30, fillcolor: testTheme.pass });
    // insertion-loss <= 1 dB at 100 Hz: gain from −1 dB up, a narrow band around 100 Hz; it fails (1.5 dB lost).
    expect(loss.status).toBe('fail');
    expect(rects.find((s) => s.x0 === 100 / 1.03)).toMatchObject({ y0: -1, fillcolor: testTheme.fail });
    const marks = figure.data.filter((d) => d.mode === 'markers');
    expect(marks.find((d) => (d.x as number[])[0] === attenuation.worstAt)?.y).toEqual([-attenuation.measured]);
    expect(marks.find((d) => (d.x as number[])[0] === 100)?.y).toEqual([-loss.measured]);
  });

  it('draws a notch frequency and an anti-resonance as bands of frequency, and a max-impedance limit on the impedance plot', () => {
    const decoupling = 'C3 [p gnd] 10n esl 0.5n esr 1m\nC4 [p gnd] 1u esl 1n esr 1m\nshow impedance p\n';
    const result = analyze(
      `${BRIDGED_T}${decoupling}require out notch-frequency = 1.6k ± 5%\nrequire impedance p anti-resonance >= 10M\nrequire impedance p max-impedance <= 50`,
    );
    expect(result.requirements.map((q) => q.status)).toEqual(['pass', 'pass', 'pass']);
    const full = (figure: Figure) => shapesOf(figure).filter((s) => s.type === 'rect' && s.yref === 'y domain');
    expect(full(bodeOf(result))).toEqual([expect.objectContaining({ x0: 1520, x1: 1680 })]);
    const impedance = figuresFor([{ result }], testTheme).find((f) => f.kind === 'impedance') as Figure;
    expect(full(impedance)).toEqual([expect.objectContaining({ x0: 10e6 })]);
    const max = result.requirements[2];
    expect(shapesOf(impedance).find((s) => s.type === 'rect' && s.yref === 'y')).toMatchObject({ y1: 50, x0: max.over?.from, x1: max.over?.to });
    expect(impedance.data.find((d) => d.mode === 'markers' && (d.x as number[])[0] === max.worstAt)?.y).toEqual([max.measured]);
  });
});
