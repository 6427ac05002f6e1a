import { analyze, FIRST_EXAMPLE } from '@rolloff/solver';
import { cleanup, render, screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Config, Data, Layout } from 'plotly.js-basic-dist-min';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { bodeFigure } from '../../../test/plot-figures';
import CircuitPlots from './circuit-plots';
import { readPlotTheme } from './plot-theme';
import { figuresFor } from './result-figures';
import type { Figure } from './figure-style';

// Plotly cannot draw in jsdom (no SVG geometry): the chart's calls to it are recorded instead.
const plotly = vi.hoisted(() => ({
  react: vi.fn(async (element: HTMLElement, _data: Data[], _layout: Partial<Layout>, _config: Partial<Config>) =>
    Object.assign(element, { on: vi.fn(), removeAllListeners: vi.fn() }),
  ),
  relayout: vi.fn(async (element: HTMLElement, _update: Partial<Layout>) => Object.assign(element, { on: vi.fn(), removeAllListeners: vi.fn() })),
  purge: vi.fn(),
  downloadImage: vi.fn(async () => ''),
}));
vi.mock('plotly.js-basic-dist-min', () => ({ default: plotly }));

const result = analyze(FIRST_EXAMPLE);
// jsdom's Blob has no text(); its FileReader reads one.
const textOf = (blob: Blob) =>
  new Promise<string>((resolve) => {
    const reader = new FileReader();
    reader.onload = () => resolve(reader.result as string);
    reader.readAsText(blob);
  });
const controls = () => screen.getByRole('group', { name: 'Bode plot controls' });

describe('the plot toolbar', () => {
  let saved: { name: string; blob: Blob }[];
  beforeEach(() => {
    vi.clearAllMocks();
    saved = [];
    const blobs = new Map<string, Blob>();
    vi.spyOn(URL, 'createObjectURL').mockImplementation((blob) => {
      const url = `blob:test/${blobs.size}`;
      blobs.set(url, blob as Blob);
      return url;
    });
    vi.spyOn(URL, 'revokeObjectURL').mockImplementation(() => undefined);
    vi.spyOn(HTMLAnchorElement.prototype, 'click').mockImplementation(function (this: HTMLAnchorElement) {
      saved.push({ name: this.download, blob: blobs.get(this.href) as Blob });
    });
  });
  afterEach(() => {
    cleanup();
    vi.restoreAllMocks();
  });

  it('gives each plot PNG, SVG, CSV and reset-zoom buttons, one tab stop each', async () => {
    render(<CircuitPlots series={[{ result }]} filename="demo-cell-1" />);
    const buttons = within(controls()).getAllByRole('button');
    expect(buttons.map((b) => b.getAttribute('aria-label'))).toEqual([
      'Download Bode plot as PNG',
      'Download Bode plot as SVG',
      'Download Bode plot curves as CSV',
      'Reset zoom of Bode plot',
    ]);
    for (const button of buttons) expect(button.tagName).toBe('BUTTON');
    // Tabbing from before the toolbar visits its four buttons in turn, and nothing else between.
    const user = userEvent.setup();
    await user.click(screen.getByText('Bode plot', { selector: 'span' }));
    for (const button of buttons) {
      await user.tab();
      expect(document.activeElement).toBe(button);
    }
  });

  it('offers no upload or sharing of the chart: Plotly’s own mode bar and its links are off', async () => {
    const { container } = render(<CircuitPlots series={[{ result }]} filename="demo-cell-1" />);
    await waitFor(() => expect(plotly.react).toHaveBeenCalled());
    const config = plotly.react.mock.calls[0][3];
    expect(config).toMatchObject({ displayModeBar: false, showLink: false, showSendToCloud: false, showEditInChartStudio: false });
    const offers = [...container.querySelectorAll('*')].filter((element) =>
      [
        element.textContent,
        element.getAttribute('aria-label'),
        element.getAttribute('title'),
        element.getAttribute('data-title'),
        element.getAttribute('href'),
      ].some((text) => /cloud|chart studio|share|upload|plotly\.com|plot\.ly/i.test(text ?? '')),
    );
    expect(offers).toEqual([]);
  });

  it('saves the images through Plotly and the curves as CSV at the sweep points', async () => {
    render(<CircuitPlots series={[{ result }]} filename="demo-cell-1" />);
    const user = userEvent.setup();
    await user.click(within(controls()).getByRole('button', { name: 'Download Bode plot as SVG' }));
    expect(plotly.downloadImage).toHaveBeenCalledWith(expect.any(HTMLElement), expect.objectContaining({ format: 'svg', filename: 'demo-cell-1-bode' }));

    await user.click(within(controls()).getByRole('button', { name: 'Download Bode plot curves as CSV' }));
    expect(saved.map((s) => s.name)).toEqual(['demo-cell-1-bode.csv']);
    const lines = (await textOf(saved[0].blob)).trimEnd().split('\r\n');
    const trace = result.traces[0];
    // The header names each curve by its legend name and its axis title, as the plot does.
    const layout = bodeFigure([{ result }]).layout;
    const title = (axis: typeof layout.xaxis) => (axis?.title as { text: string }).text;
    expect(lines[0].split(',')).toEqual([title(layout.xaxis), `${trace.label} ${title(layout.yaxis)}`, `${trace.label} ${title(layout.yaxis2)}`]);
    // One row per sweep point, holding the solver's own numbers.
    expect(lines).toHaveLength(result.frequencies.length + 1);
    for (const i of [0, 57, result.frequencies.length - 1]) {
      expect(lines[i + 1].split(',').map(Number)).toEqual([result.frequencies[i], trace.magnitudeDb[i], trace.phaseDeg[i]]);
    }
  });

  it('draws the curves first, the shapes and annotations after, and resets the zoom to the figure’s own ranges', async () => {
    render(<CircuitPlots series={[{ result }]} filename="demo-cell-1" />);
    const { shapes, annotations, ...rest } = (figuresFor([{ result }], readPlotTheme()).find((f) => f.kind === 'bode') as Figure).layout;
    await waitFor(() => expect(plotly.relayout).toHaveBeenCalledTimes(1));
    expect(plotly.react.mock.calls[0][2]).toEqual({ ...rest, shapes: [], annotations: [] });
    expect(plotly.relayout.mock.calls[0][1]).toEqual({ shapes, annotations });
    // Plotly writes a zoom into the layout it was given (as here); the figure's own must not change.
    const drawn = plotly.react.mock.calls[0][2];
    drawn.xaxis = { ...drawn.xaxis, range: [3, 4] };
    await userEvent.setup().click(within(controls()).getByRole('button', { name: 'Reset zoom of Bode plot' }));
    await waitFor(() => expect(plotly.react).toHaveBeenCalledTimes(2));
    expect(plotly.react.mock.calls[1][2]).toEqual({ ...rest, shapes, annotations });
  });
});
