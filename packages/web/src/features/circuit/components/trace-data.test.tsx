import { analyze } from '@rolloff/solver';
import { cleanup, render, screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { afterEach, describe, expect, it } from 'vitest';
import { plotSummary } from '../lib/readout-labels';
import { TraceData, valuesInWords } from './trace-data';

// An RC low-pass with its corner at 1/(2πRC) = 1 kHz (R = 1 kΩ, C = 159.155 nF).
const rc = (sweep: string) => analyze(`drive in\nR1 [in out] 1k\nC1 [out gnd] 159.155n\nshow out\n${sweep}\n`);

describe('reading the curves without the plot', () => {
  afterEach(cleanup);

  it('says every trace’s value at a frequency, and whether it lies between sweep points', () => {
    const result = rc('sweep at 100, 1k, 10k');
    // A first-order low-pass is −3.01 dB and −45° at its corner (common practice).
    expect(valuesInWords(result, 1000)).toMatch(/^At 1 kHz: out: -3\.01 dB, -45(\.0+)? ?°\.$/);
    expect(valuesInWords(result, 2000)).toContain('(between sweep points)');
    expect(valuesInWords(result, 50)).toBe('50 Hz is outside the sweep (100 Hz to 10 kHz).');
  });

  it('steps along the sweep with the arrow keys and answers as it goes', async () => {
    render(<TraceData result={rc('sweep at 100, 1k, 10k')} />);
    await userEvent.click(screen.getByText(/Read the curves/));
    const field = screen.getByLabelText(/^Value at a frequency/);
    await userEvent.click(field);
    await userEvent.keyboard('{ArrowUp}');
    expect((field as HTMLInputElement).value).toBe('100 Hz');
    await userEvent.keyboard('{ArrowUp}');
    expect((field as HTMLInputElement).value).toBe('1 kHz');
    expect(screen.getByTestId('value-at-frequency').textContent).toContain('-3.01 dB');
    await userEvent.clear(field);
    await userEvent.type(field, 'fast');
    expect(screen.getByTestId('value-at-frequency').textContent).toContain('is not a frequency');
  });

  it('pages through a table of the traces at the sweep points', async () => {
    const result = rc('sweep 1 .. 1M, 100/decade');
    render(<TraceData result={result} />);
    const table = screen.getByTestId('traces-table');
    expect(table.querySelector('caption')?.textContent).toBe(`The traces at the sweep points, rows 1–50 of ${result.frequencies.length}`);
    expect(table.querySelectorAll('tbody tr')).toHaveLength(50);
    expect([...table.querySelectorAll('thead th')].map((th) => th.textContent)).toEqual(['Frequency', 'out · gain (dB)', 'out · phase (°)']);
    await userEvent.click(screen.getByRole('button', { name: 'Next rows' }));
    expect(table.querySelector('caption')?.textContent).toContain('rows 51–100');
  });

  it('reads each variant of a cell with a vary line, chosen by name', async () => {
    const result = analyze(`let R = 1k\ndrive in\nR1 [in out] R\nC1 [out gnd] 159.155n\nshow out\nsweep at 100, 1k, 10k\nvary R over 1k, 10k\n`);
    render(<TraceData result={result} />);
    await userEvent.click(screen.getByText(/Read the curves/));
    const field = screen.getByLabelText(/^Value at a frequency/);
    await userEvent.type(field, '1k');
    // R = 1 kΩ puts the corner at 1 kHz: −3.01 dB there; R = 10 kΩ puts it at 100 Hz, and a
    // first-order low-pass a decade above its corner is −20.04 dB (common practice).
    expect(screen.getByTestId('value-at-frequency').textContent).toContain('-3.01 dB');
    await userEvent.selectOptions(screen.getByLabelText('Variant'), result.variants![1].label);
    expect(screen.getByTestId('value-at-frequency').textContent).toContain('-20.04 dB');
  });

  it('sums the plots up in words from the readouts', () => {
    const result = rc('sweep 10 .. 100k');
    expect(plotSummary(result.traces, result.readouts)).toMatch(/^The plots show out: .*corner 1 kHz/i);
  });
});
